// Check-ins waiting to reach the server (lib/browser/outbox.ts). Each item holds only the
// patient id, the idempotency key, the answers and when they were answered (ASVS 14.3.3): a
// check-in answered at 2 am and sent at 8 am reaches the care team as answered at 2 am.
import { createOutbox, newKey, OUTBOX_EVENT, type OutboxEventDetail } from "@/lib/browser/outbox";
import type { SubmittedAnswers } from "@/lib/shared/check-in-flow";

export { newKey, OUTBOX_EVENT };
export type PendingCheckIn = { patientId: string; idempotencyKey: string; answers: SubmittedAnswers; answeredAt?: string };
export type SentDetail = Extract<OutboxEventDetail, { ok: boolean }>;

export const checkInOutbox = createOutbox<PendingCheckIn>({
  name: "check-in",
  storageKey: "caddis.checkInOutbox.v1",
  url: "/api/check-ins",
  keyOf: (i) => i.idempotencyKey,
  parse: (i) => {
    if (!i || typeof i !== "object") return null;
    const { patientId, idempotencyKey, answers, answeredAt } = i as Record<string, unknown>;
    if (typeof patientId !== "string" || typeof idempotencyKey !== "string" || !answers || typeof answers !== "object") return null;
    // Items queued by an older version have no time: the server then times them at arrival.
    return { patientId, idempotencyKey, answers: answers as SubmittedAnswers, ...(typeof answeredAt === "string" ? { answeredAt } : {}) };
  },
});

/** Puts a finished check-in in the outbox; the time it was answered is kept from the first time. */
export function enqueueCheckIn(item: Omit<PendingCheckIn, "answeredAt">) {
  const earlier = checkInOutbox.list().find((i) => i.idempotencyKey === item.idempotencyKey);
  checkInOutbox.enqueue({ ...item, answeredAt: earlier?.answeredAt ?? new Date().toISOString() });
}
