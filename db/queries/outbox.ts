import "server-only";
// The e-mail outbox: rows are written in the transaction of the change that caused them and
// delivered by lib/jobs/outbox-worker.ts. A worker claims one row at a time (FOR UPDATE SKIP
// LOCKED, so workers never wait on each other) with a lease; a worker that dies mid-send leaves
// the lease to run out and the row is claimed again.
import { randomUUID } from "node:crypto";
import { and, asc, desc, eq, inArray, like, lt, lte, or, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { outboundMessages, type NewOutboundMessage, type OutboundMessage } from "@/db/schema";

export const OUTBOX_CHANNEL = "caddis_outbox";

/** Inserts unless a row with the same idempotency key exists; returns the row's id either way. */
export async function insertOutboundMessage(
  { values }: { values: NewOutboundMessage & { idempotencyKey: string } },
  tx: Executor = db,
): Promise<{ id: string; created: boolean; status: OutboundMessage["status"] }> {
  const [row] = await tx
    .insert(outboundMessages)
    .values(values)
    .onConflictDoNothing({ target: outboundMessages.idempotencyKey })
    .returning({ id: outboundMessages.id, status: outboundMessages.status });
  if (row) return { ...row, created: true };
  const [existing] = await tx
    .select({ id: outboundMessages.id, status: outboundMessages.status })
    .from(outboundMessages)
    .where(eq(outboundMessages.idempotencyKey, values.idempotencyKey));
  return { ...existing, created: false };
}

/** NOTIFY is transactional: listeners hear it only when (and if) the caller's transaction commits. */
export async function notifyOutbox({ id }: { id: string }, tx: Executor = db) {
  await tx.execute(sql`select pg_notify(${OUTBOX_CHANNEL}, ${id})`);
}

/**
 * Claims the next message that is due (queued and due now, or 'sending' with a lapsed lease):
 * status 'sending', one more attempt, a fresh claim token and a lease. Null when nothing is due.
 */
export async function claimNextMessage(
  { leaseMs, keyPrefix }: { leaseMs: number; /** Only keys starting with this (a dedicated lane, e.g. "care-team-alert:"). */ keyPrefix?: string },
  tx: Executor = db,
): Promise<OutboundMessage | null> {
  const due = tx
    .select({ id: outboundMessages.id })
    .from(outboundMessages)
    .where(
      and(
        or(
          and(eq(outboundMessages.status, "queued"), lte(outboundMessages.nextAttemptAt, sql`now()`)),
          and(eq(outboundMessages.status, "sending"), lt(outboundMessages.leaseUntil, sql`now()`)),
        ),
        keyPrefix ? like(outboundMessages.idempotencyKey, `${escapeLike(keyPrefix)}%`) : undefined,
      ),
    )
    .orderBy(asc(outboundMessages.nextAttemptAt), asc(outboundMessages.createdAt))
    .limit(1)
    .for("update", { skipLocked: true });
  const [row] = await tx
    .update(outboundMessages)
    .set({
      status: "sending",
      attempts: sql`${outboundMessages.attempts} + 1`,
      claimToken: randomUUID(),
      leaseUntil: sql`now() + ${Math.round(leaseMs)} * interval '1 millisecond'`,
    })
    .where(inArray(outboundMessages.id, due))
    .returning();
  return row ?? null;
}

/** Marks a claimed message sent; false if this worker's claim had lapsed and been taken over. */
export async function markMessageSent({ id, claimToken }: { id: string; claimToken: string }, tx: Executor = db) {
  const rows = await tx
    .update(outboundMessages)
    .set({
      status: "sent",
      sentAt: sql`now()`,
      claimToken: null,
      leaseUntil: null,
      html: sql`case when ${outboundMessages.redactAfterSend} then '' else ${outboundMessages.html} end`,
      text: sql`case when ${outboundMessages.redactAfterSend} then '' else ${outboundMessages.text} end`,
    })
    .where(and(eq(outboundMessages.id, id), eq(outboundMessages.claimToken, claimToken), eq(outboundMessages.status, "sending")))
    .returning({ id: outboundMessages.id });
  return rows.length > 0;
}

/** After a failed attempt: queued again after the back-off, or failed for good after the last try. */
export async function markMessageAttemptFailed(
  { id, claimToken, error, final, retryInMs }: { id: string; claimToken: string; error: string; final: boolean; retryInMs: number },
  tx: Executor = db,
) {
  const rows = await tx
    .update(outboundMessages)
    .set({
      status: final ? "failed" : "queued",
      lastError: error.slice(0, 1000),
      claimToken: null,
      leaseUntil: null,
      nextAttemptAt: final ? sql`${outboundMessages.nextAttemptAt}` : sql`now() + ${Math.round(retryInMs)} * interval '1 millisecond'`,
      ...(final
        ? {
            html: sql`case when ${outboundMessages.redactAfterSend} then '' else ${outboundMessages.html} end`,
            text: sql`case when ${outboundMessages.redactAfterSend} then '' else ${outboundMessages.text} end`,
          }
        : {}),
    })
    .where(and(eq(outboundMessages.id, id), eq(outboundMessages.claimToken, claimToken), eq(outboundMessages.status, "sending")))
    .returning({ id: outboundMessages.id });
  return rows.length > 0;
}

export type OutboundMessageDto = {
  id: string;
  kind: string;
  to: string;
  subject: string;
  text: string;
  status: OutboundMessage["status"];
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string;
  sentAt: string | null;
  createdAt: string;
  resendOfId: string | null;
  attachments: string[];
  /** The body held a one-time secret and was blanked once sent (or given up). */
  redacted: boolean;
};

export function toMessageDto(m: OutboundMessage): OutboundMessageDto {
  return {
    id: m.id,
    kind: m.kind,
    to: m.toAddress,
    subject: m.subject,
    text: m.text,
    status: m.status,
    attempts: m.attempts,
    lastError: m.lastError,
    nextAttemptAt: m.nextAttemptAt.toISOString(),
    sentAt: m.sentAt?.toISOString() ?? null,
    createdAt: m.createdAt.toISOString(),
    resendOfId: m.resendOfId,
    attachments: m.attachments.map((a) => a.filename),
    redacted: m.redactAfterSend && (m.status === "sent" || m.status === "failed") && m.text === "",
  };
}

/** Every message about one patient, newest first. */
export async function listPatientMessages({ patientId }: { patientId: string }, tx: Executor = db) {
  const rows = await tx
    .select()
    .from(outboundMessages)
    // The Letters tab lists e-mails; texts and pushes are the person's own reminders.
    .where(and(eq(outboundMessages.patientId, patientId), eq(outboundMessages.channel, "email")))
    .orderBy(desc(outboundMessages.createdAt), desc(outboundMessages.id));
  return rows.map(toMessageDto);
}

export async function getPatientMessage({ patientId, messageId }: { patientId: string; messageId: string }, tx: Executor = db) {
  const [row] = await tx
    .select()
    .from(outboundMessages)
    .where(and(eq(outboundMessages.id, messageId), eq(outboundMessages.patientId, patientId), eq(outboundMessages.channel, "email")));
  return row ?? null;
}

function escapeLike(text: string) {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** How many resends of a message exist (keys `<key>:resend:<n>`). */
export async function countResends({ idempotencyKey }: { idempotencyKey: string }, tx: Executor = db) {
  const pattern = `${escapeLike(idempotencyKey)}:resend:%`;
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(outboundMessages)
    .where(like(outboundMessages.idempotencyKey, pattern));
  return row.n;
}

/** One message by id (the worker, tests). */
export async function getMessageById({ id }: { id: string }, tx: Executor = db) {
  const [row] = await tx.select().from(outboundMessages).where(eq(outboundMessages.id, id));
  return row ?? null;
}
