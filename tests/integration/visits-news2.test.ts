// A visit with NEWS2 observations: scored on the server by lib/clinical (whatever the browser
// sent), stored with its sub-scores, band and RCP response; a medium or high band puts a
// care-team alert in the outbox in the same transaction; bad input is a 400 with every field
// error and nothing written.
import { eq, like, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postVisit } from "@/app/api/patients/[patientId]/visits/route";
import { db } from "@/db";
import { auditEvents, caseloadItems, episodeEvents, observations, outboundMessages } from "@/db/schema";
import { getPatientHistory } from "@/db/queries/history";
import { getLastVisitFindings, listObservations } from "@/db/queries/observations";
import { POST as closeItemPost } from "@/app/api/patients/[patientId]/caseload-items/[itemId]/route";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";

let arthur: string;
let nurse: string;
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();

const post = (body: unknown, cookie = nurse) => call(postVisit, `/api/patients/${arthur}/visits`, { cookie, body, params: { patientId: arthur } });

async function counts() {
  const n = async (t: typeof observations | typeof episodeEvents | typeof outboundMessages) =>
    (await db.select({ n: sql<number>`count(*)::int` }).from(t))[0]!.n;
  return { observations: await n(observations), events: await n(episodeEvents), outbox: await n(outboundMessages) };
}

beforeAll(async () => {
  arthur = await patientIdByHrn("EM-100-001");
  nurse = await sessionFor("communityNurse");
});

describe("POST /api/patients/[patientId]/visits", () => {
  it("stores a low score with its sub-scores and response, and alerts nobody", async () => {
    const before = await counts();
    // Source: RCP NEWS2 (2017) chart 1: every parameter in its 0 band → total 0, chart 4 routine.
    const res = await post({
      occurredAt: minutesAgo(30),
      notes: "Routine visit",
      observations: { respirationRate: 16, spo2: 97, spo2Scale: 1, onOxygen: false, systolicBp: 128, pulse: 72, consciousness: "A", temperatureC: 37.5 },
    });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.observation.news2).toEqual({
      total: 0,
      subscores: { respirationRate: 0, spo2: 0, air: 0, systolicBp: 0, pulse: 0, consciousness: 0, temperature: 0 },
      risk: "low",
      response: "routine",
    });
    expect(body.alerted).toBe(0);
    const after = await counts();
    expect(after).toEqual({ observations: before.observations + 1, events: before.events + 1, outbox: before.outbox });
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, body.eventId));
    expect(event).toMatchObject({ kind: "visit", notes: "Routine visit", patientId: arthur });
    const [audit] = await db.select().from(auditEvents).where(eq(auditEvents.action, "visit.create"));
    expect(audit).toMatchObject({ patientId: arthur, via: "care_team" });
  });

  it("scores on the server and alerts the care team for a high band, in the same transaction", async () => {
    // Source: RCP NEWS2 (2017) chart 1: RR 26 → 3, SpO2 91 (scale 1) → 3, oxygen → 2, SBP 88 → 3,
    // pulse 135 → 3, new confusion → 3, 39.2 °C → 2; total 19 (high, emergency response).
    const res = await post({
      occurredAt: minutesAgo(20),
      observations: { respirationRate: "26", spo2: "91", spo2Scale: "1", onOxygen: true, systolicBp: "88", pulse: "135", consciousness: "C", temperatureC: "39.2" },
    });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.observation.news2).toMatchObject({ total: 19, risk: "high", response: "emergency" });
    expect(body.alerted).toBeGreaterThan(0);
    const [row] = await db.select().from(observations).where(eq(observations.id, body.observation.id));
    expect(row).toMatchObject({ news2Total: 19, news2Risk: "high", news2Response: "emergency", spo2Scale: 1, onOxygen: true, consciousness: "C" });
    const mail = await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `care-team-alert:news2:${row!.id}:%`));
    expect(mail.length).toBe(body.alerted);
    expect(mail[0]!.subject).toContain("NEWS2");
  });

  it("alerts for medium (total 5) and for low-medium (a single 3), not for low", async () => {
    // Source: RCP NEWS2 (2017) chart 1: RR 22 → 2, SpO2 95 → 1, SBP 105 → 1, pulse 95 → 1 → total 5.
    const medium = await (await post({ occurredAt: minutesAgo(10), observations: { respirationRate: 22, spo2: 95, spo2Scale: 1, onOxygen: false, systolicBp: 105, pulse: 95, consciousness: "A", temperatureC: 37 } })).json();
    expect(medium.observation.news2).toMatchObject({ total: 5, risk: "medium", response: "urgent" });
    expect(medium.alerted).toBeGreaterThan(0);
    // Source: RCP NEWS2 (2017) chart 1 and 4: RR 8 → 3 alone, total 3 → low-medium, urgent ward review.
    const single = await (await post({ occurredAt: minutesAgo(9), observations: { respirationRate: 8, spo2: 97, spo2Scale: 1, onOxygen: false, systolicBp: 120, pulse: 70, consciousness: "A", temperatureC: 37 } })).json();
    expect(single.observation.news2).toMatchObject({ total: 3, risk: "low-medium", response: "urgent-ward-review" });
    // Escalated when in doubt: the urgent review the chart asks for needs someone to hear of it.
    expect(single.alerted).toBeGreaterThan(0);
    // Source: RCP NEWS2 (2017) chart 1: pulse 95 → 1, everything else 0 → total 1, low.
    const low = await (await post({ occurredAt: minutesAgo(8.5), observations: { respirationRate: 16, spo2: 97, spo2Scale: 1, onOxygen: false, systolicBp: 120, pulse: 95, consciousness: "A", temperatureC: 37 } })).json();
    expect(low.observation.news2).toMatchObject({ total: 1, risk: "low" });
    expect(low.alerted).toBe(0);
  });

  it("uses scale 2 only as chosen: 93 % on oxygen scores 1, on air 0", async () => {
    // Source: RCP NEWS2 (2017) chart 1, SpO2 scale 2: 93–94 on oxygen → 1; ≥ 93 on air → 0.
    const base = { respirationRate: 16, spo2: 93, spo2Scale: 2, systolicBp: 128, pulse: 72, consciousness: "A", temperatureC: 37 };
    const oxygen = await (await post({ occurredAt: minutesAgo(8), observations: { ...base, onOxygen: true } })).json();
    expect(oxygen.observation.news2.subscores).toMatchObject({ spo2: 1, air: 2 });
    const air = await (await post({ occurredAt: minutesAgo(7), observations: { ...base, onOxygen: false } })).json();
    expect(air.observation.news2.subscores).toMatchObject({ spo2: 0, air: 0 });
  });

  it("refuses bad observations with every field error and writes nothing", async () => {
    const before = await counts();
    const res = await post({
      occurredAt: new Date(Date.now() + 3600_000).toISOString(),
      observations: { respirationRate: 200, spo2: "ninety", spo2Scale: 3, onOxygen: "maybe", systolicBp: 120.5, pulse: "", consciousness: "X", temperatureC: 37.25 },
    });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(Object.keys(error.fields).sort()).toEqual(
      [
        "occurredAt",
        "observations.consciousness",
        "observations.onOxygen",
        "observations.pulse",
        "observations.respirationRate",
        "observations.spo2",
        "observations.spo2Scale",
        "observations.systolicBp",
        "observations.temperatureC",
      ].sort(),
    );
    expect(await counts()).toEqual(before);
  });

  it("records a visit without observations", async () => {
    const res = await post({ occurredAt: minutesAgo(5), notes: "Bag changed, no concerns" });
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ observation: null, alerted: 0 });
  });

  it("shows the visit in History with its measured values beside the sub-scores, and first among earlier observations", async () => {
    // Source: RCP NEWS2 (2017) chart 1: RR 21 → 2, SpO2 93 (scale 1) → 2, air → 0, SBP 120 → 0,
    // pulse 95 → 1, alert → 0, 37.5 °C → 0: total 5, medium.
    const res = await post({
      occurredAt: minutesAgo(1),
      notes: "History check",
      observations: { respirationRate: 21, spo2: 93, spo2Scale: 1, onOxygen: false, systolicBp: 120, pulse: 95, consciousness: "A", temperatureC: 37.5 },
    });
    const body = await res.json();
    const history = await getPatientHistory({ patientId: arthur });
    const event = history.episodes.flatMap((e) => e.events).find((v) => v.id === body.eventId);
    expect(event).toMatchObject({ kind: "visit", notes: "History check" });
    expect(event!.observation).toMatchObject({
      values: { respirationRate: 21, spo2: 93, spo2Scale: 1, onOxygen: false, systolicBp: 120, pulse: 95, consciousness: "A", temperatureC: 37.5 },
      news2: { total: 5, risk: "medium", subscores: { respirationRate: 2, spo2: 2, air: 0, systolicBp: 0, pulse: 1, consciousness: 0, temperature: 0 } },
    });
    const [latest] = await listObservations({ patientId: arthur, limit: 5 });
    expect(latest!.id).toBe(body.observation.id);
  });

  it("stores a structured visit's findings; a sample sent leaves a result to chase until marked done; the next form starts from them", async () => {
    const nextWeek = new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10);
    const findings = {
      draining: "true",
      bypassing: "false",
      urine: ["cloudy", "debris"],
      site: "red-or-sore",
      bagChanged: true,
      valveChanged: false,
      catheterChanged: true,
      sampleSent: true,
      advice: "Drink 2 litres a day; keep the bag below the bladder.",
      nextVisitOn: nextWeek,
    };
    const res = await post({ occurredAt: minutesAgo(0.5), findings });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body).toMatchObject({ sampleToChase: true, catheterChanged: true, observation: null });
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, body.eventId));
    expect((event!.details as { findings: unknown }).findings).toEqual({ ...findings, draining: true, bypassing: false });
    const [item] = await db.select().from(caseloadItems).where(eq(caseloadItems.eventId, body.eventId));
    expect(item).toMatchObject({ kind: "sample-result", closedAt: null, dueAt: null });
    // The next visit starts from these findings, without what was changed or the old date.
    expect(await getLastVisitFindings({ patientId: arthur })).toMatchObject({ draining: true, urine: ["cloudy", "debris"], site: "red-or-sore", nextVisitOn: undefined });
    // Marked done with the result (no action needed for a sample).
    const done = await call(closeItemPost, `/api/patients/${arthur}/caseload-items/${item!.id}`, { cookie: nurse, params: { patientId: arthur, itemId: item!.id }, body: { note: "No growth." } });
    expect(done.status).toBe(200);
    expect((await db.select().from(caseloadItems).where(eq(caseloadItems.id, item!.id)))[0]).toMatchObject({ note: "No growth.", action: null, closedByName: "Grace Mensah" });
  });

  it("refuses bad findings with every field error and writes nothing", async () => {
    const before = await counts();
    const res = await post({
      occurredAt: minutesAgo(0.2),
      findings: { draining: "maybe", bypassing: "", urine: [], site: "purple", bagChanged: "x", nextVisitOn: "2001-01-01", extra: 1 },
    });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(Object.keys(error.fields)).toEqual(expect.arrayContaining(["findings.draining", "findings.bypassing", "findings.urine", "findings.site", "findings.bagChanged", "findings.nextVisitOn"]));
    expect(await counts()).toEqual(before);
  });
});
