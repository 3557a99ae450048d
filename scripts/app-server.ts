// Starting the production app server (scripts/server.ts) as one process whose PID is the
// server's, for `npm start`, the test stages, the bench and the tests that run their own instance.
import { spawn, type StdioOptions } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

export function spawnAppServer({
  port,
  hostname = "127.0.0.1",
  env,
  stdio = "inherit",
}: {
  port: number | string;
  hostname?: string;
  env: NodeJS.ProcessEnv;
  stdio?: StdioOptions;
}) {
  return spawn(process.execPath, ["--import", "tsx", path.join(root, "scripts/server.ts"), "--port", String(port), "--hostname", hostname], {
    cwd: root,
    env,
    stdio,
  });
}

/** Waits until the server answers a page (any status below 500). */
export async function waitForApp(url: string, seconds = 60) {
  for (let i = 0; i < seconds * 4; i++) {
    try {
      const r = await fetch(`${url}/en/sign-in`, { redirect: "manual" });
      if (r.status < 500) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`app did not answer on ${url} within ${seconds} s`);
}
