import "server-only";
// The background work of one process: the outbox worker and the pg-boss schedules. Started by
// instrumentation.ts in every Next.js server (CADDIS_BACKGROUND=off to leave it out) and by
// scripts/worker.ts to scale out; many at once are safe (see docs/email.md).
import type { PgBoss } from "pg-boss";
import { env } from "@/lib/config/env";
import { OutboxWorker, type OutboxWorkerOptions } from "./outbox-worker";

export type Background = { outbox: OutboxWorker | null; boss: PgBoss | null; stop: () => Promise<void> };

const cache = globalThis as unknown as { caddisBackground?: Promise<Background> };

export function startBackground(
  { outbox = true, schedules = true, worker = {} }: { outbox?: boolean; schedules?: boolean; worker?: OutboxWorkerOptions } = {},
): Promise<Background> {
  cache.caddisBackground ??= (async () => {
    const log = worker.log ?? ((m: string) => console.log(`[jobs] ${m}`));
    const ob = outbox ? await new OutboxWorker(worker).start() : null;
    let boss: PgBoss | null = null;
    if (schedules) {
      try {
        const { startBoss } = await import("./boss");
        boss = await startBoss({ onSweep: async () => void (await ob?.kick()), log });
      } catch (e) {
        // The outbox still works without the schedules; say so loudly.
        log(`pg-boss did not start: ${e instanceof Error ? e.message : String(e)}`);
      }
    }
    log(`background started (outbox ${ob ? "on" : "off"}, schedules ${boss ? "on" : "off"}, SMTP ${redact(worker.smtpUrl ?? env.SMTP_URL)})`);
    return {
      outbox: ob,
      boss,
      stop: async () => {
        await boss?.stop({ graceful: true, timeout: 10_000 }).catch(() => {});
        await ob?.stop();
        cache.caddisBackground = undefined;
      },
    };
  })();
  return cache.caddisBackground;
}

function redact(url: string) {
  try {
    const u = new URL(url);
    if (u.password) u.password = "***";
    return u.toString();
  } catch {
    return "(invalid SMTP_URL)";
  }
}
