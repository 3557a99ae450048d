// db:backup and db:restore round-trip the demo data (issue: fault suite).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { backup, restore } from "../../scripts/db-backup";
import { dropDatabase, ensureDatabase } from "../../scripts/services";

const source = process.env.DATABASE_URL!;
const target = (() => {
  const u = new URL(source);
  u.pathname = `/caddis_restore_${process.pid}`;
  return u.toString();
})();
const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "caddis-backup-")), "demo.dump");

async function snapshot(url: string) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const tables = await client.query<{ name: string }>(
      "select tablename as name from pg_tables where schemaname = 'public' order by tablename",
    );
    const out: Record<string, string> = {};
    for (const { name } of tables.rows) {
      // Whole table content, order-independent, as one digest per table.
      const r = await client.query(`select md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as d, count(*) as n from "${name}" t`);
      out[name] = `${r.rows[0].n}:${r.rows[0].d}`;
    }
    return out;
  } finally {
    await client.end();
  }
}

afterAll(async () => {
  await dropDatabase(target);
  fs.rmSync(path.dirname(file), { recursive: true, force: true });
});

describe("backup and restore", () => {
  it("restores every table, row for row, into an empty database", async () => {
    const before = await snapshot(source);
    expect(Number(before.patients.split(":")[0])).toBeGreaterThan(0);
    backup(source, file);
    expect(fs.statSync(file).size).toBeGreaterThan(1000);
    await ensureDatabase(target);
    restore(file, target);
    expect(await snapshot(target)).toEqual(before);
  });

  it("restoring over changed data puts the backup's state back", async () => {
    const client = new pg.Client({ connectionString: target });
    await client.connect();
    await client.query("delete from diary_entries");
    await client.query("update patients set given_name = 'Changed'");
    await client.end();
    restore(file, target);
    expect(await snapshot(target)).toEqual(await snapshot(source));
  });
});
