// A fingerprint of every application table (from db/schema), so a test can prove a refused
// request wrote nothing: not a row added, removed or changed.
import { getTableName, is, sql } from "drizzle-orm";
import { PgTable } from "drizzle-orm/pg-core";
import { db } from "@/db";
import * as schema from "@/db/schema";

export const schemaTables: string[] = (Object.values(schema) as unknown[])
  .filter((v): v is PgTable => is(v, PgTable))
  .map((t) => getTableName(t))
  .sort();

export type Snapshot = Record<string, string>;

// Columns that record that a row was used, not changed by what a request asked: a session's
// "last seen" (written at most every 5 minutes by any signed-in request, lib/auth/session.ts).
const usageColumns: Record<string, string[]> = { session: ["last_seen_at", "ip_address", "user_agent"] };

/** Row count and an md5 of every row's text, per table, in one query. */
export async function snapshot(tables: string[] = schemaTables): Promise<Snapshot> {
  const rowText = (t: string) => (usageColumns[t] ? `(to_jsonb(x) - array[${usageColumns[t].map((c) => `'${c}'`).join(",")}])::text` : "x::text");
  const parts = tables.map(
    (t) =>
      `select '${t}' as t, count(*)::text || ':' || coalesce(md5(string_agg(${rowText(t)}, '|' order by ${rowText(t)})), '') as h from "${t}" x`,
  );
  const result = await db.execute<{ t: string; h: string }>(sql.raw(parts.join(" union all ")));
  return Object.fromEntries(result.rows.map((r) => [r.t, r.h]));
}

/** Tables whose fingerprint differs, leaving out those a caller expects to change. */
export function changedTables(before: Snapshot, after: Snapshot, allowed: readonly string[] = []): string[] {
  return Object.keys(before).filter((t) => before[t] !== after[t] && !allowed.includes(t));
}

/** Tables in the database's public schema: db/schema must declare every one. */
export async function databaseTables(): Promise<string[]> {
  const r = await db.execute<{ table_name: string }>(
    sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by 1`,
  );
  return r.rows.map((x) => x.table_name);
}
