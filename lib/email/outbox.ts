import "server-only";
// queueMessage: the only way Caddis sends e-mail. The row is written in the caller's
// transaction, so a message exists if and only if the change that caused it was committed; the
// worker (lib/jobs/outbox-worker.ts) delivers it. See docs/email.md.
import { z } from "zod";
import type { Executor } from "@/db";
import { insertOutboundMessage, notifyOutbox } from "@/db/queries/outbox";
import { listPushSubscriptions } from "@/db/queries/push-subscriptions";
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

/** A mobile number as the SMS service takes it: E.164 ("+" then 7 to 15 digits). */
export const E164 = /^\+[1-9][0-9]{6,14}$/;

export type QueueTextInput = {
  idempotencyKey: string;
  kind: string;
  /** E.164; null or invalid: kept as failed ("no_recipient"), like an e-mail with no address. */
  to: string | null;
  text: string;
  patientId?: string | null;
  locale?: string;
  sourceId?: string | null;
};

/** A text message through the same outbox as e-mail (one row per key, sent by the worker). */
export async function queueText(tx: Executor, input: QueueTextInput): Promise<QueuedMessage> {
  if (!input.idempotencyKey) throw new Error("queueText: idempotencyKey is required");
  const to = (input.to ?? "").trim();
  const deliverable = E164.test(to);
  const text = input.text.trim();
  const result = await insertOutboundMessage(
    {
      values: {
        idempotencyKey: input.idempotencyKey,
        messageId: messageIdFor(input.idempotencyKey),
        kind: input.kind,
        channel: "sms",
        toAddress: deliverable ? to : "",
        subject: text.replace(/\s+/g, " ").slice(0, 80),
        html: "",
        text,
        locale: input.locale ?? "en",
        patientId: input.patientId ?? null,
        sourceId: input.sourceId ?? null,
        ...(deliverable ? {} : { status: "failed" as const, lastError: NO_RECIPIENT }),
      },
    },
    tx,
  );
  if (result.created && deliverable) await notifyOutbox({ id: result.id }, tx);
  return result;
}

export type QueuePushInput = {
  /** Per device, the subscription's id is added: `<key>:<subscriptionId>`. */
  idempotencyKey: string;
  kind: string;
  userId: string;
  title: string;
  body: string;
  /** The page the notification opens, a path in the app (e.g. "/en/check-in"). */
  link: string;
  patientId?: string | null;
  locale?: string;
  sourceId?: string | null;
};

/**
 * A push to each of the person's subscribed browsers, through the same outbox. With none, one
 * row is kept as failed ("no_recipient") so the gap shows instead of vanishing.
 */
export async function queuePush(tx: Executor, input: QueuePushInput): Promise<QueuedMessage[]> {
  if (!input.idempotencyKey) throw new Error("queuePush: idempotencyKey is required");
  const targets = await listPushSubscriptions({ userId: input.userId }, tx);
  const rows = targets.length ? targets.map((t) => ({ key: `${input.idempotencyKey}:${t.id}`, to: t.id })) : [{ key: input.idempotencyKey, to: "" }];
  const out: QueuedMessage[] = [];
  for (const r of rows) {
    const result = await insertOutboundMessage(
      {
        values: {
          idempotencyKey: r.key,
          messageId: messageIdFor(r.key),
          kind: input.kind,
          channel: "push",
          toAddress: r.to,
          subject: input.title.replace(/[\r\n]+/g, " ").trim(),
          html: "",
          text: input.body,
          link: input.link,
          locale: input.locale ?? "en",
          patientId: input.patientId ?? null,
          sourceId: input.sourceId ?? null,
          ...(r.to ? {} : { status: "failed" as const, lastError: NO_RECIPIENT }),
        },
      },
      tx,
    );
    if (result.created && r.to) await notifyOutbox({ id: result.id }, tx);
    out.push(result);
  }
  return out;
}
