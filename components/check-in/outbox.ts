// Check-ins waiting to reach the server, kept on the phone so none is lost when the network is
// down. Each item holds only the patient id, the idempotency key and the answers (ASVS 14.3.3);
// the shared sign-out clears it with the rest of localStorage. The server's idempotency key
// makes every resend safe: a check-in is stored once however often it is sent.
import { apiFetch, isApiError } from "@/lib/browser/api-client";
import type { SubmittedAnswers } from "@/lib/shared/check-in-flow";

export const OUTBOX_KEY = "caddis.checkInOutbox.v1";
export const SENT_EVENT = "caddis:check-in-sent";

export type PendingCheckIn = { patientId: string; idempotencyKey: string; answers: SubmittedAnswers };
export type SentDetail = { idempotencyKey: string; ok: boolean; level?: string; status: number };

function read(): PendingCheckIn[] {
  try {
    const raw = localStorage.getItem(OUTBOX_KEY);
    const list: unknown = raw ? JSON.parse(raw) : [];
    if (!Array.isArray(list)) return [];
    return list
      .filter((i): i is PendingCheckIn => !!i && typeof i.patientId === "string" && typeof i.idempotencyKey === "string" && typeof i.answers === "object")
      .map(({ patientId, idempotencyKey, answers }) => ({ patientId, idempotencyKey, answers }));
  } catch {
    return [];
  }
}

function write(list: PendingCheckIn[]) {
  try {
    if (list.length) localStorage.setItem(OUTBOX_KEY, JSON.stringify(list));
    else localStorage.removeItem(OUTBOX_KEY);
  } catch {
    /* storage full or blocked: the page still tries to send at once */
  }
}

export function pendingCheckIns(): PendingCheckIn[] {
  return read();
}

export function enqueueCheckIn(item: PendingCheckIn) {
  const list = read().filter((i) => i.idempotencyKey !== item.idempotencyKey);
  write([...list, { patientId: item.patientId, idempotencyKey: item.idempotencyKey, answers: item.answers }]);
}

function remove(key: string) {
  write(read().filter((i) => i.idempotencyKey !== key));
}

// Answers that can never be accepted are dropped rather than retried for ever; anything else
// (offline, server busy, signed out) stays for the next try.
const FINAL_REFUSALS = new Set([400, 403, 404, 409, 413, 415]);

let flushing: Promise<void> | null = null;

/** Sends every waiting check-in once; safe to call often (one run at a time per tab). */
export function flushCheckIns(): Promise<void> {
  flushing ??= (async () => {
    try {
      for (const item of read()) {
        let status = 200;
        let level: string | undefined;
        try {
          level = (await apiFetch<{ checkIn?: { level?: string } }>("/api/check-ins", { method: "POST", body: item })).checkIn?.level;
        } catch (error) {
          if (!isApiError(error) || error.status === 0) break; // offline: stop, try again later
          status = error.status;
        }
        if (status === 200) {
          remove(item.idempotencyKey);
          window.dispatchEvent(new CustomEvent<SentDetail>(SENT_EVENT, { detail: { idempotencyKey: item.idempotencyKey, ok: true, level, status } }));
        } else if (FINAL_REFUSALS.has(status)) {
          remove(item.idempotencyKey);
          window.dispatchEvent(new CustomEvent<SentDetail>(SENT_EVENT, { detail: { idempotencyKey: item.idempotencyKey, ok: false, status } }));
        }
      }
    } finally {
      flushing = null;
    }
  })();
  return flushing;
}

/** A random UUID v4, also where crypto.randomUUID is missing (older phones, plain http). */
export function newKey(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6] & 0x0f) | 0x40;
  b[8] = (b[8] & 0x3f) | 0x80;
  const h = [...b].map((x) => x.toString(16).padStart(2, "0")).join("");
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}
