/**
 * `npm test`: every test, on services this script starts on loopback.
 *   1. unit tests (vitest, with the lib/clinical coverage gate)
 *   2. integration tests on a fresh PostgreSQL database with migrations and the demo seed
 *   3. end-to-end tests in Debian's chromium against the production build of the app
 * `npm test -- unit|integration|e2e` runs one stage; file filters after the stage narrow it
 * (`npm test -- e2e tests/e2e/passport.test.ts`). The test database is dropped at the end.
 */
import { spawnSync } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { spawnAppServer, waitForApp } from "./app-server";
import { ensureTools } from "./ensure-tools";
import { defaults, dropDatabase, ensureDatabase, portOpen, servicesUp } from "./services";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const bin = (name: string) => path.join(root, "node_modules/.bin", name);
const stage = process.argv[2] ?? "all";
// Anything after the stage goes to vitest as file filters (one stage only).
const filters = stage === "all" ? [] : process.argv.slice(3);
const started = Date.now();

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv, label: string) {
  const t = Date.now();
  console.log(`\n[test] ── ${label}`);
  const r = spawnSync(cmd, args, { cwd: root, stdio: "inherit", env });
  console.log(`[test] ${label}: ${r.status === 0 ? "passed" : "FAILED"} in ${((Date.now() - t) / 1000).toFixed(0)} s`);
  return r.status === 0;
}

async function main() {
  const base: NodeJS.ProcessEnv = { ...process.env, NEXT_TELEMETRY_DISABLED: "1", NODE_OPTIONS: "" };
  let ok = true;

  if (stage === "all") {
    ok = run(bin("tsc"), ["--noEmit", "-p", "tsconfig.json"], base, "type check (app, scripts and tests)") && ok;
  }
  if (stage === "all" || stage === "unit") {
    ok = run(bin("vitest"), ["run", "--project", "unit", ...(stage === "all" ? ["--coverage"] : []), ...filters], { ...base, NODE_ENV: "test" }, "unit tests") && ok;
  }
  if (stage === "unit") return ok;

  await servicesUp();
  // The integration stage renders PDFs with pdftoppm too, not only the browser stage.
  ensureTools();
  const dbName = `caddis_test_${process.pid}_${Date.now().toString(36)}`;
  const dbUrl = new URL(defaults.databaseUrl);
  dbUrl.pathname = `/${dbName}`;
  const databaseUrl = dbUrl.toString();
  await ensureDatabase(databaseUrl);
  // One auth secret for the seed, the integration tests and the app: the demo admin's TOTP secret
  // is encrypted with it.
  const env: NodeJS.ProcessEnv = {
    ...base,
    DATABASE_URL: databaseUrl,
    CADDIS_TEST_DATABASE: "1",
    BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET ?? "e2e-secret-0123456789abcdefghijklmnopqrstuvwxyz",
  };
  try {
    if (!run(bin("tsx"), ["db/migrate.ts"], env, "migrations on a fresh database")) return false;
    if (!run(bin("tsx"), ["db/seed.ts"], env, "demo seed")) return false;

    if (stage === "all" || stage === "integration") {
      ok = run(bin("vitest"), ["run", "--project", "integration", ...filters], { ...env, NODE_ENV: "test" }, "integration tests") && ok;
    }
    if (stage === "all" || stage === "e2e") {
      const port = Number(process.env.E2E_PORT ?? 3100);
      if (await portOpen(port)) throw new Error(`port ${port} is busy; set E2E_PORT`);
      const appUrl = `http://localhost:${port}`;
      const appEnv: NodeJS.ProcessEnv = {
        ...env,
        APP_URL: appUrl,
        NODE_ENV: "production",
        // The tests stand in for a load balancer on loopback: each browser or request says which
        // client it plays in X-Forwarded-For (tests/e2e/client-address.test.ts runs an instance
        // that trusts no proxy, as `npm start` does by default).
        TRUSTED_PROXIES: "127.0.0.1, ::1",
      };
      if (!run(bin("next"), ["build"], appEnv, "production build")) return false;
      const server = spawnAppServer({ port, env: appEnv, stdio: ["ignore", "inherit", "inherit"] });
      try {
        await waitForApp(appUrl, 60);
        ok =
          run(
            bin("vitest"),
            ["run", "--project", "e2e", ...filters],
            // The second-instance test starts another server with the same settings.
            { ...env, NODE_ENV: "test", E2E_BASE_URL: appUrl, E2E_APP_SECRET: appEnv.BETTER_AUTH_SECRET, E2E_TRUSTED_PROXIES: appEnv.TRUSTED_PROXIES },
            "end-to-end tests",
          ) && ok;
      } finally {
        server.kill("SIGTERM");
      }
    }
  } finally {
    if (!process.env.KEEP_TEST_DB) await dropDatabase(databaseUrl).catch(() => {});
  }
  return ok;
}

main()
  .then((ok) => {
    console.log(`\n[test] ${ok ? "all stages passed" : "some stages FAILED"} in ${((Date.now() - started) / 1000).toFixed(0)} s`);
    process.exit(ok ? 0 : 1);
  })
  .catch((e) => {
    console.error(`[test] ${e instanceof Error ? e.stack : e}`);
    process.exit(1);
  });
