/**
 * Queues the care teams' weekly digest now (the pg-boss schedule does it every Monday 07:00),
 * for the demo or after a missed run. Any running worker or app server then sends it.
 *   npx tsx scripts/digest.ts            every care team; once a day (same key)
 *   npx tsx scripts/digest.ts --force    again, with a new key
 *   npx tsx scripts/digest.ts --send     and deliver the outbox from this process too
 */
import "./server-only-shim.cjs";
import { pool } from "@/db";
import { localToday, queueWeeklyDigests } from "@/lib/email/digest";
import { drainOutbox } from "@/lib/jobs/outbox-worker";

async function main() {
  const force = process.argv.includes("--force");
  const r = await queueWeeklyDigests({ keySuffix: force ? `:manual:${Date.now()}` : "" });
  console.log(`[digest] ${localToday()}: ${r.queued} digest(s) queued for ${r.organisations} care team(s)${r.queued < r.organisations ? " (the rest were already queued today: use --force)" : ""}`);
  if (process.argv.includes("--send")) {
    const sent = await drainOutbox({ keyPrefix: "digest:" });
    console.log(`[digest] sent ${sent.sent}, to retry ${sent.retry}, failed ${sent.failed}`);
  }
  await pool.end();
}

main().catch(async (e) => {
  console.error("[digest] failed:", e);
  await pool.end().catch(() => {});
  process.exit(1);
});
