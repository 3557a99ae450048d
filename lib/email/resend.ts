import "server-only";
// Resending a message: a new outbox row (key `<original key>:resend:<n>`), to the receiving
// organisation's current inbox, with the same body and attachments. The original row is kept.
import type { Executor } from "@/db";
import { countResends } from "@/db/queries/outbox";
import { getOrganisation } from "@/db/queries/mail-context";
import type { OutboundMessage } from "@/db/schema";
import { AppError } from "@/lib/http/errors";
import { queueMessage } from "./outbox";

export async function resendMessage(tx: Executor, { original, createdByUserId }: { original: OutboundMessage; createdByUserId: string }) {
  if (original.status === "queued" || original.status === "sending") {
    throw new AppError("conflict", "This message is still on its way.");
  }
  if (original.redactAfterSend) {
    throw new AppError("conflict", "This message held a one-time code or link: send a new invitation instead.");
  }
  const rootKey = original.idempotencyKey.replace(/(:resend:\d+)+$/, "");
  const n = (await countResends({ idempotencyKey: rootKey }, tx)) + 1;
  const org = original.organisationId ? await getOrganisation({ id: original.organisationId }, tx) : null;
  return queueMessage(tx, {
    idempotencyKey: `${rootKey}:resend:${n}`,
    kind: original.kind,
    to: org ? org.inboxEmail : original.toAddress,
    subject: original.subject,
    html: original.html,
    text: original.text,
    attachments: original.attachments,
    patientId: original.patientId,
    organisationId: original.organisationId,
    locale: original.locale,
    sourceId: original.sourceId,
    resendOfId: original.resendOfId ?? original.id,
    createdByUserId,
  });
}
