// Nothing half-written: when the last write of a change fails (here the event insert, made to
// throw), the old catheter is still in place, no new one exists and no audit event is left.
import { randomUUID } from "node:crypto";
import { and, count, eq, isNull } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { POST as postInsertion } from "@/app/api/patients/[patientId]/episodes/route";
import { POST as postChange } from "@/app/api/patients/[patientId]/episodes/change/route";
import { POST as postRemoval } from "@/app/api/patients/[patientId]/episodes/removal/route";
import { db } from "@/db";
import { auditEvents, careTeam, catheterEpisodes, episodeEvents, organisations, patients } from "@/db/schema";
import { call, sessionFor } from "../support/http";

const failing = vi.hoisted(() => ({ on: false }));
vi.mock("@/db/queries/episodes", async (importOriginal) => {
  const original = await importOriginal<typeof import("@/db/queries/episodes")>();
  return {
    ...original,
    insertEpisodeEvent: async (...args: Parameters<typeof original.insertEpisodeEvent>) => {
      if (failing.on) throw new Error("simulated failure after the episode rows were written");
      return original.insertEpisodeEvent(...args);
    },
  };
});

type Handler = Parameters<typeof call>[0];
const device = {
  route: "urethral", catheterType: "two-way", material: "all-silicone", lengthCategory: "standard",
  sizeCh: 14, balloonMl: 10, gelKind: "none", attempts: 1, indication: "Chronic urinary retention",
};

async function snapshot(patientId: string) {
  const [e] = await db.select({ n: count() }).from(catheterEpisodes).where(eq(catheterEpisodes.patientId, patientId));
  const [v] = await db.select({ n: count() }).from(episodeEvents).where(eq(episodeEvents.patientId, patientId));
  const [a] = await db.select({ n: count() }).from(auditEvents).where(eq(auditEvents.patientId, patientId));
  const active = await db
    .select({ id: catheterEpisodes.id })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
  return { episodes: e.n, events: v.n, audits: a.n, active: active.map((r) => r.id) };
}

describe("episode writes are all or nothing", () => {
  it("a change and a removal that fail at their last write leave the record as it was", async () => {
    const [org] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
    const [p] = await db
      .insert(patients)
      .values({ givenName: "Atomic", familyName: "Test", healthRecordNumber: `AT-${randomUUID()}`, dateOfBirth: "1950-01-01", sex: "male" })
      .returning({ id: patients.id });
    await db.insert(careTeam).values({ patientId: p.id, organisationId: org.id });
    const cookie = await sessionFor("communityNurse");
    const path = `/api/patients/${p.id}/episodes`;
    const send = (handler: unknown, suffix: string, body: unknown) =>
      call(handler as Handler, path + suffix, { body, cookie, params: { patientId: p.id } });

    const first = await send(postInsertion, "", { ...device, insertedAt: new Date(Date.now() - 7200_000).toISOString() });
    expect(first.status).toBe(201);
    const before = await snapshot(p.id);

    failing.on = true;
    try {
      const change = await send(postChange, "/change", { ...device, insertedAt: new Date(Date.now() - 600_000).toISOString(), changeKind: "planned" });
      expect(change.status).toBe(500);
      expect((await change.json()).error.code).toBe("internal");
      expect(await snapshot(p.id)).toEqual(before);

      const removal = await send(postRemoval, "/removal", { removedAt: new Date().toISOString(), reason: "no-longer-needed" });
      expect(removal.status).toBe(500);
      expect(await snapshot(p.id)).toEqual(before);
    } finally {
      failing.on = false;
      await db.delete(patients).where(eq(patients.id, p.id));
    }
  });
});
