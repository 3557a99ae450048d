import "server-only";
// queueMessage: the only way Caddis sends e-mail. The row is written in the caller's
// transaction, so a message exists if and only if the change that caused it was committed; the
// worker (lib/jobs/outbox-worker.ts) delivers it. See docs/email.md.
import { z } from "zod";
import type { Executor } from "@/db";
import { insertOutboundMessage, notifyOutbox } from "@/db/queries/outbox";
import type { AttachmentDescriptor } from "@/db/schema";
import { messageIdFor } from "./message-id";

export type QueueMessageInput = {
  /** One message per causing event, e.g. `gp-summary:change:<eventId>`. */
  idempotencyKey: string;
  /** e.g. "gp-summary", "supply-request", "care-team-alert", "digest", "invitation". */
  kind: string;
  /** The recipient; empty or null when none is known: the row is kept as failed ("no_recipient"). */
  to: string | null;
  subject: string;
  html: string;
  text: string;
  /** Rendered at send time (lib/email/attachments.ts). */
  attachments?: AttachmentDescriptor[];
  patientId?: string | null;
  /** The receiving organisation, so a resend goes to its current inbox. */
  organisationId?: string | null;
  locale?: string;
  sourceId?: string | null;
  resendOfId?: string | null;
  createdByUserId?: string | null;
  /** The body holds a one-time secret: blank it once sent, and never resend it. */
  redactAfterSend?: boolean;
};

export type QueuedMessage = { id: string; created: boolean; status: "queued" | "sending" | "sent" | "failed" };

export const NO_RECIPIENT = "no_recipient";

const address = z.email();

/**
 * Writes one outbox row in `tx` (ON CONFLICT (idempotency_key) DO NOTHING: queueing the same
 * event twice gives one message) and wakes the workers when `tx` commits.
 */
export async function queueMessage(tx: Executor, input: QueueMessageInput): Promise<QueuedMessage> {
  if (!input.idempotencyKey) throw new Error("queueMessage: idempotencyKey is required");
  const to = (input.to ?? "").trim();
  const deliverable = to !== "" && address.safeParse(to).success;
  const result = await insertOutboundMessage(
    {
      values: {
        idempotencyKey: input.idempotencyKey,
        messageId: messageIdFor(input.idempotencyKey),
        kind: input.kind,
        toAddress: deliverable ? to : "",
        // A header value never spans lines.
        subject: input.subject.replace(/[\r\n]+/g, " ").trim(),
        // Undeliverable and holding a one-time secret: keep the row, not the secret.
        html: !deliverable && input.redactAfterSend ? "" : input.html,
        text: !deliverable && input.redactAfterSend ? "" : input.text,
        attachments: input.attachments ?? [],
        locale: input.locale ?? "en",
        patientId: input.patientId ?? null,
        organisationId: input.organisationId ?? null,
        sourceId: input.sourceId ?? null,
        resendOfId: input.resendOfId ?? null,
        createdByUserId: input.createdByUserId ?? null,
        redactAfterSend: input.redactAfterSend ?? false,
        // Nothing to send to: kept as failed so the Letters tab and the digest show it.
        ...(deliverable ? {} : { status: "failed" as const, lastError: NO_RECIPIENT }),
      },
    },
    tx,
  );
  if (result.created && deliverable) await notifyOutbox({ id: result.id }, tx);
  return result;
}
