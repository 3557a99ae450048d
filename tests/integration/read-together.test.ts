// Independent reads inside a transaction run one after another on its one connection (pg queues
// a second statement sent while one runs, warns, and will refuse it in a later version); on the
// pool they still run side by side.
import pg from "pg";
import { sql } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { db, readTogether } from "@/db";
import { getLeadTeamContact } from "@/db/queries/contacts";
import { getFhirExportData } from "@/db/queries/fhir-export";
import { patientIdByHrn } from "../support/fixtures";

/** How many statements were sent while another was still running on the same client. */
async function queuedWhile<T>(fn: () => Promise<T>) {
  const original = pg.Client.prototype.query;
  let queued = 0;
  const spy = vi.spyOn(pg.Client.prototype, "query").mockImplementation(function (this: pg.Client & { _activeQuery?: unknown; _queryQueue?: unknown[] }, ...args: unknown[]) {
    if (this._activeQuery || (this._queryQueue?.length ?? 0) > 0) queued++;
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof original);
  try {
    return { result: await fn(), queued };
  } finally {
    spy.mockRestore();
  }
}

describe("readTogether", () => {
  it("runs reads in turn inside a transaction, in order, with nothing queued", async () => {
    const { result, queued } = await queuedWhile(() =>
      db.transaction((tx) =>
        readTogether(
          tx,
          () => tx.execute<{ n: number }>(sql`select pg_sleep(0.02), 1 as n`),
          () => tx.execute<{ n: number }>(sql`select 2 as n`),
          () => tx.execute<{ n: number }>(sql`select 3 as n`),
        ),
      ),
    );
    expect(result.map((r) => r.rows[0]!.n)).toEqual([1, 2, 3]);
    expect(queued).toBe(0);
  });

  it("leaves the query functions that read several things at once queue-free inside a transaction", async () => {
    const patientId = await patientIdByHrn("EM-100-002");
    const { result, queued } = await queuedWhile(() =>
      db.transaction(async (tx) => ({ lead: await getLeadTeamContact({ patientId }, tx), fhir: await getFhirExportData({ patientId }, tx) })),
    );
    expect(result.lead).not.toBeNull();
    expect(result.fhir?.episodes.length).toBeGreaterThan(0);
    expect(queued).toBe(0);
  });

  it("still reads side by side on the pool, on two connections", async () => {
    const [a, b] = await readTogether(
      db,
      () => db.execute<{ pid: number }>(sql`select pg_backend_pid() as pid, pg_sleep(0.05)`),
      () => db.execute<{ pid: number }>(sql`select pg_backend_pid() as pid, pg_sleep(0.05)`),
    );
    expect(a.rows[0]!.pid).not.toBe(b.rows[0]!.pid);
  });
});
