// The database client: one pg pool per process, cached on globalThis so development reloads
// do not open a new pool each time.
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { PgTransaction } from "drizzle-orm/pg-core";
import pg from "pg";
import { env } from "@/lib/config/env";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;
export type Transaction = Parameters<Parameters<Database["transaction"]>[0]>[0];
/** A database handle or an open transaction: query functions accept either. */
export type Executor = Database | Transaction;

const cache = globalThis as unknown as { caddisPool?: pg.Pool; caddisDb?: Database };

function createPool() {
  const pool = new pg.Pool({
    connectionString: env.DATABASE_URL,
    max: env.DATABASE_POOL_MAX,
    connectionTimeoutMillis: 5_000,
    idleTimeoutMillis: 30_000,
    // Finds a connection the network or a database restart dropped, instead of waiting on it.
    keepAlive: true,
    // No JIT: the app's statements are short, and compiling the caseload's (its cost passes the
    // JIT threshold at 100,000 patients) took 0.8 s of its 1.5 s (docs/performance.md).
    options: "-c jit=off",
  });
  // A dropped connection (e.g. a database restart) must not crash the process; the pool
  // replaces the client on the next query.
  pool.on("error", (err) => console.error("[db] idle client error:", err.message));
  // A client checked out (inside a transaction, between two queries) when the server goes away
  // emits "error" with no listener of the pool's: without this it is an uncaught exception. The
  // pending query still fails (answered 503) and the pool drops the broken client on release.
  pool.on("connect", (client) => {
    client.on("error", (err) => console.error("[db] client error:", err.message));
  });
  return pool;
}

export const pool: pg.Pool = cache.caddisPool ?? createPool();
export const db: Database = cache.caddisDb ?? drizzle(pool, { schema, casing: "snake_case" });
cache.caddisPool = pool;
cache.caddisDb = db;

export { schema };

/**
 * Runs independent reads side by side on the pool, but one after another inside a transaction:
 * a transaction is one connection, which runs one statement at a time (pg queues a second one
 * and warns that it will refuse it in a later version).
 */
export async function readTogether<T extends readonly unknown[]>(tx: Executor, ...reads: { [K in keyof T]: () => Promise<T[K]> }): Promise<T> {
  if (!(tx instanceof PgTransaction)) return (await Promise.all(reads.map((read) => read()))) as unknown as T;
  const results: unknown[] = [];
  for (const read of reads) results.push(await read());
  return results as unknown as T;
}
