// Drops and recreates the database of DATABASE_URL, applies the migrations and seeds the demo.
import { defaults, dropDatabase, ensureDatabase } from "../scripts/services";
import { runMigrations } from "./migrate";

async function main() {
  const url = defaults.databaseUrl;
  await dropDatabase(url);
  await ensureDatabase(url);
  await runMigrations(url);
  const { seed } = await import("./seed");
  await seed();
  const { pool } = await import("./index");
  await pool.end();
}

main().catch((e) => {
  console.error("[db:reset] failed:", e);
  process.exit(1);
});
