/**
 * A standalone background worker: delivers the e-mail outbox and runs the pg-boss schedules
 * (the care teams' weekly digest). Run as many as you like beside the app servers:
 *   node --conditions=import --import tsx scripts/worker.ts              outbox + schedules
 *   node --conditions=import --import tsx scripts/worker.ts --outbox-only
 * `--conditions=import`: @react-pdf's packages export their files for `import` only, and tsx
 * loads this project's .ts files as CommonJS. Configuration from the environment
 * (DATABASE_URL, SMTP_URL, MAIL_*; see .env.example).
 */
import "./server-only-shim.cjs";
import { startBackground } from "@/lib/jobs/runtime";

async function main() {
  const flags = [...process.execArgv, process.env.NODE_OPTIONS ?? ""].join(" ");
  if (!/--conditions[= ]import|-C[= ]?import/.test(flags)) {
    console.error("[worker] start me with: node --conditions=import --import tsx scripts/worker.ts (PDF attachments need it)");
    process.exit(2);
  }
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
