// Next.js calls register() once when a server starts: every app instance also delivers the
// e-mail outbox and runs the schedules, so `npm start` sends mail with nothing else running.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  if (process.env.CADDIS_BACKGROUND === "off") return;
  try {
    const { startBackground } = await import("./lib/jobs/runtime");
    await startBackground();
  } catch (e) {
    // The app serves pages without it; queued mail waits for a worker (nothing is lost).
    console.error("[jobs] background work did not start:", e);
  }
}
