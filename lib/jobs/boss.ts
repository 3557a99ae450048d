import "server-only";
// pg-boss (jobs in PostgreSQL): the schedules. The care teams' weekly digest, the patients'
// daily change reminders and the daily retention of closed records run from cron schedules, and
// a once-a-minute sweep of the outbox backs up the workers' own LISTEN and poll.
// pg-boss sends each scheduled job once however many instances run, and the digest's
// idempotency keys make even a repeat harmless.
import { PgBoss } from "pg-boss";
import { env } from "@/lib/config/env";

export const QUEUES = { digest: "care-team-digest", reminders: "change-reminders", sweep: "outbox-sweep", retention: "record-retention" } as const;

export async function startBoss({ onSweep, log }: { onSweep: () => Promise<void>; log: (m: string) => void }) {
  const boss = new PgBoss({ connectionString: env.DATABASE_URL, max: 3, application_name: "caddis-jobs" });
  boss.on("error", (e) => log(`pg-boss: ${e instanceof Error ? e.message : String(e)}`));
  await boss.start();
  await boss.createQueue(QUEUES.digest, { retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 900 });
  await boss.createQueue(QUEUES.reminders, { retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 900 });
  await boss.createQueue(QUEUES.sweep, { retryLimit: 0, expireInSeconds: 300, deleteAfterSeconds: 3600 });
  await boss.createQueue(QUEUES.retention, { retryLimit: 3, retryDelay: 300, retryBackoff: true, expireInSeconds: 3600 });
  await boss.schedule(QUEUES.digest, env.DIGEST_CRON, {}, { tz: env.CADDIS_TIME_ZONE });
  await boss.schedule(QUEUES.reminders, env.REMINDER_CRON, {}, { tz: env.CADDIS_TIME_ZONE });
  await boss.schedule(QUEUES.sweep, "* * * * *", {}, { tz: "UTC" });
  // Closed records past the retention period (Settings) are removed once a day.
  await boss.schedule(QUEUES.retention, env.RETENTION_CRON, {}, { tz: env.CADDIS_TIME_ZONE });
  await boss.work(QUEUES.digest, async () => {
    const { queueWeeklyDigests } = await import("@/lib/email/digest");
    const r = await queueWeeklyDigests({});
    log(`weekly digest: ${r.queued} queued for ${r.organisations} care teams`);
  });
  await boss.work(QUEUES.reminders, async () => {
    const { queueChangeReminders } = await import("@/lib/email/patient-reminders");
    const r = await queueChangeReminders({});
    log(`change reminders: ${r.queued} queued for ${r.patients} patients`);
  });
  await boss.work(QUEUES.retention, async () => {
    const { removeExpiredRecords } = await import("@/lib/jobs/retention");
    await removeExpiredRecords({ log: (m) => log(`retention: ${m}`) });
  });
  await boss.work(QUEUES.sweep, async () => {
    await onSweep();
  });
  return boss;
}
