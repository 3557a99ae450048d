// The phone's outboxes: what a patient or carer entered, kept in localStorage until the server
// has it, so nothing is lost offline or when the tab is closed. Each item carries its own key
// (the server keeps one row per key, so a resend is safe) and the time it was entered (the
// server keeps that time, within bounds). Sent on load, when the phone is back online, every
// 30 s and at once after each entry (components/portal/outbox-sync.tsx). The shared sign-out
// clears localStorage with the rest.

/** Fired on window whenever an outbox changes or an item was sent or refused. */
import { apiFetch, isApiError } from "@/lib/browser/api-client";

export const OUTBOX_EVENT = "caddis:outbox";
export type OutboxEventDetail = { queue: string; key: string; ok: boolean; status: number; body?: unknown } | { queue: string; changed: true };

// Answers that can never be accepted are dropped rather than retried for ever; anything else
// (offline, server busy, signed out) stays for the next try.
const FINAL_REFUSALS = new Set([400, 403, 404, 409, 413, 415]);

export type Outbox<T> = {
  readonly name: string;
  list(): T[];
  enqueue(item: T): void;
  remove(key: string): void;
  /** Sends every waiting item once, oldest first; one run at a time per tab. */
  flush(): Promise<void>;
};

const registry: Outbox<unknown>[] = [];

export function createOutbox<T>({
  name,
  storageKey,
  url,
  keyOf,
  parse,
}: {
  name: string;
  storageKey: string;
  url: string;
  keyOf: (item: T) => string;
  /** A stored value back to an item, or null when it is not one (storage from an older version, or tampered with). */
  parse: (value: unknown) => T | null;
}): Outbox<T> {
  const read = (): T[] => {
    try {
      const raw = localStorage.getItem(storageKey);
      const list: unknown = raw ? JSON.parse(raw) : [];
      return Array.isArray(list) ? list.map(parse).filter((x): x is T => x !== null) : [];
    } catch {
      return [];
    }
  };
  const write = (list: T[]) => {
    try {
      if (list.length) localStorage.setItem(storageKey, JSON.stringify(list));
      else localStorage.removeItem(storageKey);
    } catch {
      /* storage full or blocked: the page still tries to send at once */
    }
    window.dispatchEvent(new CustomEvent<OutboxEventDetail>(OUTBOX_EVENT, { detail: { queue: name, changed: true } }));
  };
  const remove = (key: string) => write(read().filter((i) => keyOf(i) !== key));
  let flushing: Promise<void> | null = null;

  const outbox: Outbox<T> = {
    name,
    list: read,
    enqueue(item) {
      // The same key again replaces the item but keeps its place (and so its order of sending).
      const list = read();
      const at = list.findIndex((i) => keyOf(i) === keyOf(item));
      if (at >= 0) list[at] = item;
      else list.push(item);
      write(list);
    },
    remove,
    flush() {
      flushing ??= (async () => {
        try {
          for (const item of read()) {
            let status = 200;
            let body: unknown;
            try {
              body = await apiFetch(url, { method: "POST", body: item });
            } catch (error) {
              if (!isApiError(error) || error.status === 0) break; // offline: stop, try again later
              status = error.status;
            }
            const key = keyOf(item);
            if (status === 200 || FINAL_REFUSALS.has(status)) {
              remove(key);
              window.dispatchEvent(
                new CustomEvent<OutboxEventDetail>(OUTBOX_EVENT, { detail: { queue: name, key, ok: status < 300, status, body } }),
              );
            }
          }
        } finally {
          flushing = null;
        }
      })();
      return flushing;
    },
  };
  registry.push(outbox as Outbox<unknown>);
  return outbox;
}

/** Every outbox made on this page (the check-in and the diary, once their modules are loaded). */
export function outboxes(): readonly Outbox<unknown>[] {
  return registry;
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
