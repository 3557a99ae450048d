// Every schema change is a new migration, and a database that already holds data survives it:
// a database at the previous migration, holding the demo data as it was then
// (tests/fixtures/demo-data/<migration>.sql, written by `npm run db:snapshot`), is migrated to
// the newest, keeps every row, and can be read through the current schema.
import fs from "node:fs";
import path from "node:path";
import { getTableName, is, sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import { PgTable } from "drizzle-orm/pg-core";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as schema from "@/db/schema";
import { migrationTags, runMigrations } from "@/db/migrate";
import { adminQuery } from "../support/db-admin";

const tags = migrationTags();
const snapshotOf = (tag: string) => path.resolve(__dirname, "../fixtures/demo-data", `${tag}.sql`);
const url = new URL(process.env.DATABASE_URL!);
url.pathname = `${url.pathname}_mig`;

/** Loads a snapshot (pg_dump's INSERTs) as one transaction; foreign keys are checked by the rows themselves. */
async function load(pool: pg.Pool, file: string) {
  const statements = fs
    .readFileSync(file, "utf8")
    .split("\n")
    .filter((line) => line.startsWith("INSERT INTO "));
  const client = await pool.connect();
  try {
    await client.query("begin");
    // pg_dump writes tables in name order, not in the order their references need.
    await client.query("set local session_replication_role = replica");
    for (const s of statements) await client.query(s);
    await client.query("commit");
  } catch (e) {
    await client.query("rollback");
    throw e;
  } finally {
    client.release();
  }
  return statements.length;
}

async function rowCounts(pool: pg.Pool) {
  const tables = (await pool.query<{ t: string }>("select tablename as t from pg_tables where schemaname = 'public' order by 1")).rows.map((r) => r.t);
  const counts: Record<string, number> = {};
  for (const t of tables) counts[t] = Number((await pool.query(`select count(*)::int as n from public."${t}"`)).rows[0].n);
  return counts;
}

let pool: pg.Pool;
beforeAll(async () => {
  await adminQuery(url, `drop database if exists ${url.pathname.slice(1)} with (force)`);
  await adminQuery(url, `create database ${url.pathname.slice(1)}`);
  pool = new pg.Pool({ connectionString: url.toString(), max: 2 });
});
afterAll(async () => {
  await pool?.end();
  await adminQuery(url, `drop database if exists ${url.pathname.slice(1)} with (force)`);
});

describe("migrations", () => {
  it("the newest migration has its demo-data snapshot, so the next one is tested on data (npm run db:snapshot)", () => {
    expect(fs.existsSync(snapshotOf(tags.at(-1)!)), `tests/fixtures/demo-data/${tags.at(-1)}.sql`).toBe(true);
  });

  it("migrates a database holding the demo data from the previous migration to the newest, losing nothing", { timeout: 120_000 }, async () => {
    // The previous migration's snapshot, or the latest older one when the previous was added
    // before snapshots were kept (then every migration since is applied to that data).
    let previous = tags.length - 1;
    while (previous > 0 && !fs.existsSync(snapshotOf(tags[previous - 1]!))) previous--;
    // At that migration, with the demo data as it held it (none before the first).
    await runMigrations(url.toString(), { count: previous });
    const loaded = previous > 0 ? await load(pool, snapshotOf(tags[previous - 1]!)) : 0;
    const before = previous > 0 ? await rowCounts(pool) : {};
    expect(loaded, "rows loaded").toBe(Object.values(before).reduce((a, b) => a + b, 0));

    await runMigrations(url.toString());
    const applied = (await pool.query("select count(*)::int as n from drizzle.__drizzle_migrations")).rows[0].n;
    expect(applied).toBe(tags.length);
    const after = await rowCounts(pool);
    for (const [table, n] of Object.entries(before)) expect(after[table], `${table} keeps its rows`).toBeGreaterThanOrEqual(n);

    // The newest snapshot fits the newest schema (it is what the next migration will start from).
    await pool.query(`truncate ${Object.keys(after).map((t) => `public."${t}"`).join(", ")} cascade`);
    await load(pool, snapshotOf(tags.at(-1)!));
    const withData = await rowCounts(pool);
    expect(withData.patients).toBeGreaterThan(0);
    expect(withData.catheter_episodes).toBeGreaterThan(0);

    // Every table of the current schema reads back through drizzle: each column it knows exists.
    const db = drizzle(pool, { schema });
    const tables = (Object.values(schema) as unknown[]).filter((v): v is PgTable => is(v, PgTable));
    expect(tables.length).toBeGreaterThan(20);
    for (const table of tables) {
      await expect(db.select().from(table).limit(1), getTableName(table)).resolves.toBeDefined();
    }
    expect((await db.execute(sql`select count(*)::int as n from patients`)).rows[0]).toMatchObject({ n: withData.patients });
  });
});
