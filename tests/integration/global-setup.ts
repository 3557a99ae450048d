// Integration tests need a migrated, seeded database. `npm test` makes a fresh one and passes
// DATABASE_URL; run alone (`npx vitest run --project integration`), this makes one too.
import { spawnSync } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { defaults, dropDatabase, ensureDatabase, servicesUp } from "../../scripts/services";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");

export default async function setup() {
  if (process.env.CADDIS_TEST_DATABASE) return;
  await servicesUp();
  const url = new URL(defaults.databaseUrl);
  url.pathname = `/caddis_it_${process.pid}_${Date.now().toString(36)}`;
  const databaseUrl = url.toString();
  await ensureDatabase(databaseUrl);
  process.env.DATABASE_URL = databaseUrl;
  process.env.CADDIS_TEST_DATABASE = "1";
  for (const script of ["db/migrate.ts", "db/seed.ts"]) {
    const r = spawnSync(path.join(root, "node_modules/.bin/tsx"), [script], { cwd: root, env: process.env, stdio: "inherit" });
    if (r.status !== 0) throw new Error(`${script} failed`);
  }
  return async () => {
    await dropDatabase(databaseUrl);
  };
}
