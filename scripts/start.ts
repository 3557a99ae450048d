/**
 * `npm start`: bring up the local services, apply migrations, seed the demo, build, and serve
 * the app on APP_URL (default http://localhost:3000). Ctrl-C stops the app; the services keep
 * running until `npm run services down`.
 */
import { randomBytes } from "node:crypto";
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { spawnAppServer } from "./app-server";
import { defaults, servicesUp } from "./services";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const dataDir = path.resolve(root, process.env.CADDIS_DATA_DIR ?? ".data");

function authSecret(): string {
  if (process.env.BETTER_AUTH_SECRET) return process.env.BETTER_AUTH_SECRET;
  const file = path.join(dataDir, "auth-secret");
  if (!fs.existsSync(file)) {
    fs.mkdirSync(dataDir, { recursive: true });
    fs.writeFileSync(file, randomBytes(32).toString("base64url"), { mode: 0o600 });
  }
  return fs.readFileSync(file, "utf8").trim();
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv) {
  const r = spawnSync(cmd, args, { cwd: root, stdio: "inherit", env });
  if (r.status !== 0) {
    console.error(`[start] ${path.basename(cmd)} ${args.join(" ")} failed`);
    process.exit(r.status ?? 1);
  }
}

async function main() {
  const appUrl = new URL(process.env.APP_URL ?? "http://localhost:3000");
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    APP_URL: appUrl.origin,
    DATABASE_URL: defaults.databaseUrl,
    BETTER_AUTH_SECRET: authSecret(),
    NEXT_TELEMETRY_DISABLED: "1",
  };
  await servicesUp();
  const tsx = path.join(root, "node_modules/.bin/tsx");
  run(tsx, ["db/migrate.ts"], env);
  run(tsx, ["db/seed.ts"], env);
  if (!process.argv.includes("--no-build")) run(path.join(root, "node_modules/.bin/next"), ["build"], env);
  const port = appUrl.port || "3000";
  console.log(`[start] Caddis on ${appUrl.origin} (fake inbox: ${defaults.inboxUrl})`);
  // Through the server entry (scripts/server.ts), which works out each client's address.
  const server = spawnAppServer({ port, hostname: process.env.HOST ?? "127.0.0.1", env: { ...env, NODE_ENV: "production" } });
  for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => server.kill(signal));
  server.on("exit", (code) => process.exit(code ?? 0));
}

main().catch((e) => {
  console.error(`[start] ${e instanceof Error ? e.message : e}`);
  process.exit(1);
});
