// Applies the migrations in drizzle/ to DATABASE_URL (an explicit step of start and test).
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import path from "node:path";
import { fileURLToPath } from "node:url";
import pg from "pg";

export async function runMigrations(databaseUrl: string) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 1 });
  try {
    const folder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../drizzle");
    await migrate(drizzle(pool), { migrationsFolder: folder });
  } finally {
    await pool.end();
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const url = process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:5433/caddis";
  runMigrations(url)
    .then(() => console.log("[db] migrations applied"))
    .catch((e) => {
      console.error("[db] migration failed:", e);
      // 42P07 "already exists": a database made from an earlier copy of a migration that has since
      // been regenerated (nothing is released yet, see drizzle/). Demo data can be made again.
      if ((e as { cause?: { code?: string } }).cause?.code === "42P07") {
        console.error("[db] This database was made by an earlier version of the migrations. For demo data, run `npm run db:reset` (it drops and reseeds it).");
      }
      process.exit(1);
    });
}
