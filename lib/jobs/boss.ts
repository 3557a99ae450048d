import "server-only";
// pg-boss (jobs in PostgreSQL): the schedules. The care teams' weekly digest, the patients'
// daily change reminders and the daily retention of closed records run from cron schedules, and
// a once-a-minute sweep of the outbox backs up the workers' own LISTEN and poll.
// pg-boss sends each scheduled job once however many instances run, and the digest's
// idempotency keys make even a repeat harmless.
// pg-boss 10 (its 11 and 12 need Node.js 22): handlers get an array of jobs, retention of
// finished jobs is set for the whole instance (archive, then delete), not per queue.
import { sql } from "drizzle-orm";
import PgBoss from "pg-boss";
import { db } from "@/db";
import { env } from "@/lib/config/env";

export const QUEUES = {
  digest: "care-team-digest",
  reminders: "change-reminders",
  sweep: "outbox-sweep",
  retention: "record-retention",
  acknowledge: "acknowledge-reminders",
  referrals: "referral-reminders",
  twocOverdue: "twoc-overdue",
  portalReminders: "portal-reminders",
} as const;

/** The schema version this pg-boss writes (its package's version.json). */
const PG_BOSS_SCHEMA_VERSION = 24;
const SCHEMA = "pgboss";

/**
 * A database last used by a newer pg-boss (12 writes a later schema that 10 cannot read or roll
 * back) gets a fresh pg-boss schema: it holds only the schedules, made again below, and jobs the
 * next run makes again (the outbox itself is Caddis's own table).
 */
async function dropNewerSchema(log: (m: string) => void) {
  const table = await db.execute<{ found: string | null }>(sql`select to_regclass(${`${SCHEMA}.version`})::text as found`);
  if (!table.rows[0]?.found) return;
  const version = (await db.execute<{ version: number }>(sql.raw(`select version from ${SCHEMA}.version limit 1`))).rows[0]?.version;
  if (version !== undefined && Number(version) > PG_BOSS_SCHEMA_VERSION) {
    log(`pg-boss: schema version ${version} is newer than this pg-boss (${PG_BOSS_SCHEMA_VERSION}); making it again`);
    await db.execute(sql.raw(`drop schema ${SCHEMA} cascade`));
  }
}

export async function startBoss({ onSweep, log }: { onSweep: () => Promise<void>; log: (m: string) => void }) {
  await dropNewerSchema(log);
  const boss = new PgBoss({
    connectionString: env.DATABASE_URL,
    schema: SCHEMA,
    max: 3,
    application_name: "caddis-jobs",
    // Finished jobs (a sweep a minute) leave the job table after an hour and are gone after a day.
    archiveCompletedAfterSeconds: 3600,
    deleteAfterDays: 1,
  });
  boss.on("error", (e) => log(`pg-boss: ${e instanceof Error ? e.message : String(e)}`));
  await boss.start();
  await boss.createQueue(QUEUES.digest, { name: QUEUES.digest, retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 900 });
  await boss.createQueue(QUEUES.reminders, { name: QUEUES.reminders, retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 900 });
  await boss.createQueue(QUEUES.sweep, { name: QUEUES.sweep, retryLimit: 0, expireInSeconds: 300 });
  await boss.createQueue(QUEUES.acknowledge, { name: QUEUES.acknowledge, retryLimit: 3, retryDelay: 60, expireInSeconds: 300 });
  await boss.createQueue(QUEUES.retention, { name: QUEUES.retention, retryLimit: 3, retryDelay: 300, retryBackoff: true, expireInSeconds: 3600 });
  await boss.createQueue(QUEUES.referrals, { name: QUEUES.referrals, retryLimit: 5, retryDelay: 60, retryBackoff: true, expireInSeconds: 900 });
  await boss.createQueue(QUEUES.twocOverdue, { name: QUEUES.twocOverdue, retryLimit: 3, retryDelay: 60, expireInSeconds: 300 });
  await boss.schedule(QUEUES.digest, env.DIGEST_CRON, {}, { tz: env.CADDIS_TIME_ZONE });
  await boss.schedule(QUEUES.reminders, env.REMINDER_CRON, {}, { tz: env.CADDIS_TIME_ZONE });
  await boss.schedule(QUEUES.sweep, "* * * * *", {}, { tz: "UTC" });
  // Alerts nobody acknowledged in time go to their team again (lib/records/caseload-items.ts).
  await boss.schedule(QUEUES.acknowledge, "*/5 * * * *", {}, { tz: "UTC" });
  // Closed records past the retention period (Settings) are removed once a day.
  await boss.schedule(QUEUES.retention, env.RETENTION_CRON, {}, { tz: env.CADDIS_TIME_ZONE });
  // Unanswered referrals are sent again (and flagged to the referrer) within 15 minutes of the
  // reminder time in Settings: no patient is left between two teams.
  await boss.schedule(QUEUES.referrals, "*/15 * * * *", {}, { tz: "UTC" });
  // A trial without catheter past its window with no outcome: the lead team is told within 5 minutes.
  await boss.schedule(QUEUES.twocOverdue, "*/5 * * * *", {}, { tz: "UTC" });
  // The reminders people chose (lib/portal/reminders.ts): every 5 minutes, so one comes within
  // 5 minutes of its time; its key makes a repeat harmless.
  await boss.createQueue(QUEUES.portalReminders, { name: QUEUES.portalReminders, retryLimit: 3, retryDelay: 60, expireInSeconds: 300 });
  await boss.schedule(QUEUES.portalReminders, "*/5 * * * *", {}, { tz: "UTC" });
  await boss.work(QUEUES.portalReminders, async () => {
    const { queueDueReminders } = await import("@/lib/portal/reminders");
    const r = await queueDueReminders();
    if (r.queued) log(`portal reminders: ${r.queued} queued`);
  });
  await boss.work(QUEUES.twocOverdue, async () => {
    const { sendOverdueTrialAlerts } = await import("@/lib/records/twoc-overdue");
    await sendOverdueTrialAlerts({ log });
  });
  await boss.work(QUEUES.referrals, async () => {
    const { sendReferralReminders } = await import("@/lib/email/referral-mail");
    const r = await sendReferralReminders();
    if (r.sent) log(`referral reminders: ${r.sent} sent again`);
  });
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
  await boss.work(QUEUES.acknowledge, async () => {
    const { sendAcknowledgeReminders } = await import("@/lib/records/caseload-items");
    await sendAcknowledgeReminders({ log });
  });
  await boss.work(QUEUES.sweep, async () => {
    await onSweep();
  });
  return boss;
}
