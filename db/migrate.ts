// Applies the migrations in drizzle/ to DATABASE_URL (an explicit step of start and test).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";

export const migrationsFolder = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../drizzle");

type Journal = { entries: { idx: number; tag: string }[] };

/** The migrations in the order they apply (drizzle/meta/_journal.json). */
export function migrationTags(): string[] {
  const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, "meta/_journal.json"), "utf8")) as Journal;
  return [...journal.entries].sort((a, b) => a.idx - b.idx).map((e) => e.tag);
}

/** Applies every migration, or only the first `count` (tests migrate step by step). */
export async function runMigrations(databaseUrl: string, { count }: { count?: number } = {}) {
  let folder = migrationsFolder;
  let temp: string | null = null;
  if (count !== undefined && count < migrationTags().length) {
    // The migrator reads the journal and each entry's SQL: a copy with the first `count` entries.
    temp = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-migrations-"));
    const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, "meta/_journal.json"), "utf8")) as Journal;
    const kept = [...journal.entries].sort((a, b) => a.idx - b.idx).slice(0, count);
    fs.mkdirSync(path.join(temp, "meta"));
    fs.writeFileSync(path.join(temp, "meta/_journal.json"), JSON.stringify({ ...journal, entries: kept }));
    for (const e of kept) fs.copyFileSync(path.join(migrationsFolder, `${e.tag}.sql`), path.join(temp, `${e.tag}.sql`));
    folder = temp;
  }
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 1 });
  try {
    await migrate(drizzle(pool), { migrationsFolder: folder });
  } finally {
    await pool.end();
    if (temp) fs.rmSync(temp, { recursive: true, force: true });
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
