// pg-boss 10 (the line that runs on Node.js 20) holds the schedules: it starts on a fresh
// database and on one a newer pg-boss left behind, and its jobs run. The schedules themselves
// and their jobs are tested in care-team-mail (digest), patient-mail (reminders) and
// patient-data (retention); the outbox in email-outbox.
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db";
import { QUEUES } from "@/lib/jobs/boss";
import { startBackground } from "@/lib/jobs/runtime";

const quiet = () => {};
const schemaVersion = async () => Number((await db.execute<{ version: number }>(sql`select version from pgboss.version`)).rows[0]?.version);

describe("pg-boss", () => {
  it("starts where a newer pg-boss left its schema (12 writes one 10 cannot read), and makes the schedules again", { timeout: 60_000 }, async () => {
    await db.execute(sql.raw("drop schema if exists pgboss cascade; create schema pgboss; create table pgboss.version (version int primary key); insert into pgboss.version values (26)"));
    const logs: string[] = [];
    const bg = await startBackground({ outbox: false, schedules: true, worker: { log: (m) => logs.push(m) } });
    try {
      expect(bg.boss).toBeTruthy();
      expect(logs.some((l) => l.includes("schema version 26 is newer"))).toBe(true);
      expect(await schemaVersion()).toBe(24);
      const names = (await bg.boss!.getSchedules()).map((s) => s.name).sort();
      expect(names).toEqual(Object.values(QUEUES).sort());
      // A job sent now is worked: the sweep queue's handler runs and completes it.
      const id = await bg.boss!.send(QUEUES.sweep, {});
      let state: string | undefined;
      for (let i = 0; i < 100 && state !== "completed"; i++) {
        await new Promise((r) => setTimeout(r, 200));
        state = (await bg.boss!.getJobById(QUEUES.sweep, id!))?.state;
      }
      expect(state).toBe("completed");
    } finally {
      await bg.stop();
    }
    // Started again on its own schema: nothing is dropped.
    const again = await startBackground({ outbox: false, schedules: true, worker: { log: quiet } });
    try {
      expect(again.boss).toBeTruthy();
      expect(await schemaVersion()).toBe(24);
    } finally {
      await again.stop();
    }
  });
});
