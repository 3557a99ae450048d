/**
 * A standalone background worker: delivers the e-mail outbox and runs the pg-boss schedules
 * (the care teams' weekly digest). Run as many as you like beside the app servers:
 *   npx tsx scripts/worker.ts              outbox + schedules
 *   npx tsx scripts/worker.ts --outbox-only
 * (`node --import tsx scripts/worker.ts` runs it as one process, for process managers.)
 * Configuration from the environment (DATABASE_URL, SMTP_URL, MAIL_*; see .env.example).
 */
import "./server-only-shim.cjs";
import { startBackground } from "@/lib/jobs/runtime";

async function main() {
  const outboxOnly = process.argv.includes("--outbox-only");
  const background = await startBackground({ outbox: true, schedules: !outboxOnly });
  const stop = async (signal: string) => {
    console.log(`[worker] ${signal}: finishing the message in hand, then stopping`);
    await background.stop();
    process.exit(0);
  };
  process.on("SIGINT", () => void stop("SIGINT"));
  process.on("SIGTERM", () => void stop("SIGTERM"));
  console.log(`[worker] ready (pid ${process.pid})`);
}

main().catch((e) => {
  console.error("[worker] failed to start:", e);
  process.exit(1);
});
