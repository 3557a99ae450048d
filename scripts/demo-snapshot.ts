/**
 * `npm run db:snapshot`: the demo data as the newest migration holds it, written to
 * tests/fixtures/demo-data/<migration>.sql (data only, one INSERT per row with its column names).
 * Run it after adding a migration (and after changing the seed): when the next migration comes,
 * tests/integration/migrations.test.ts loads this snapshot into a database at this migration and
 * migrates it forward, as a deployed database with data would be.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { migrationTags, runMigrations } from "../db/migrate";
import { defaults, dropDatabase, ensureDatabase, findPgBin, servicesUp } from "./services";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
export const snapshotDir = path.join(root, "tests/fixtures/demo-data");

async function main() {
  await servicesUp();
  const url = new URL(defaults.databaseUrl);
  url.pathname = `/caddis_snapshot_${process.pid}`;
  const databaseUrl = url.toString();
  await dropDatabase(databaseUrl);
  await ensureDatabase(databaseUrl);
  try {
    await runMigrations(databaseUrl);
    const seeded = spawnSync(path.join(root, "node_modules/.bin/tsx"), ["db/seed.ts"], { cwd: root, stdio: "inherit", env: { ...process.env, DATABASE_URL: databaseUrl } });
    if (seeded.status !== 0) throw new Error("seed failed");
    const bin = findPgBin();
    if (!bin) throw new Error("PostgreSQL client tools not found (npm start installs them)");
    const tag = migrationTags().at(-1)!;
    const file = path.join(snapshotDir, `${tag}.sql`);
    fs.mkdirSync(snapshotDir, { recursive: true });
    const dump = spawnSync(
      path.join(bin, "pg_dump"),
      ["--data-only", "--column-inserts", "--no-owner", "--no-privileges", "--schema=public", "--exclude-table=public.attempt_counters", "--file", file, databaseUrl],
      { stdio: "inherit" },
    );
    if (dump.status !== 0) throw new Error("pg_dump failed");
    // pg_dump's psql-only \restrict lines carry a random key: out, so the file changes only with the data.
    fs.writeFileSync(file, fs.readFileSync(file, "utf8").split("\n").filter((l) => !/^\\(un)?restrict /.test(l)).join("\n"));
    console.log(`[db] demo data at ${tag} written to ${path.relative(root, file)}`);
  } finally {
    await dropDatabase(databaseUrl);
  }
}

main().catch((e) => {
  console.error(`[db] ${e instanceof Error ? e.message : e}`);
  process.exit(1);
});
