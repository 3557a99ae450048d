// Recording an insertion, a change, a removal and a TWOC outcome through the route handlers,
// on the real database: happy paths, refusals with field errors and nothing written, the
// server-side device checks with their overrides, and who may write (ASVS 8.2.1, 8.2.2, 8.4.1).
import { randomUUID } from "node:crypto";
import { and, count, eq, inArray, isNull } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as postInsertion } from "@/app/api/patients/[patientId]/episodes/route";
import { POST as postChange } from "@/app/api/patients/[patientId]/episodes/change/route";
import { POST as postCheck } from "@/app/api/patients/[patientId]/episodes/check/route";
import { POST as postRemoval } from "@/app/api/patients/[patientId]/episodes/removal/route";
import { POST as postTwoc } from "@/app/api/patients/[patientId]/episodes/twoc/route";
import { db } from "@/db";
import { auditEvents, careTeam, catheterEpisodes, episodeEvents, organisations, patients, user, visitAccess } from "@/db/schema";
import { call, demo, sessionFor } from "../support/http";
import { demoDevice } from "../support/fixtures";

type Handler = Parameters<typeof call>[0];
// The handlers type their params as { patientId }; `call` passes a plain record.
const h = (fn: unknown) => fn as Handler;
const routes: { name: string; handler: Handler; suffix: string }[] = [
  { name: "insertion", handler: h(postInsertion), suffix: "" },
  { name: "change", handler: h(postChange), suffix: "/change" },
  { name: "removal", handler: h(postRemoval), suffix: "/removal" },
  { name: "twoc", handler: h(postTwoc), suffix: "/twoc" },
  { name: "check", handler: h(postCheck), suffix: "/check" },
];

const hourAgo = () => new Date(Date.now() - 60 * 60_000).toISOString();
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();

/** A complete insertion for an adult man, with no finding expected. */
function insertionBody(over: Record<string, unknown> = {}) {
  return {
    ...demoDevice,
    productName: "Silicone two-way 14 Ch (demo)",
    lot: "AB12",
    // Source: clinical-checks.md §7, worked element string (expiry 2028-11-30, valid check digit).
    expiry: "2028-11-30",
    gtin: "09506000134352",
    serial: "XYZ",
    udi: "010950600013435217281100" + "10AB12\u001d21XYZ",
    indication: "Chronic urinary retention",
    insertedAt: hourAgo(),
    gelKind: "plain",
    gelVolumeMl: 11,
    residualUrineMl: 350,
    urineDescription: "Clear, straw-coloured",
    specimenTaken: true,
    attempts: 1,
    patientReaction: "Comfortable throughout",
    maxDwellDays: 84,
    reviewIntervalDays: 28,
    overrides: [],
    ...over,
  };
}

let harbourside: string;
let larch: string;
let arthurId: string;
const created: string[] = [];

/** A patient of our own, so the demo patients other tests read stay as seeded. */
async function makePatient(opts: { sex?: "male" | "female"; latex?: boolean | "not-asked"; teams?: string[] } = {}) {
  const [p] = await db
    .insert(patients)
    .values({
      givenName: "Test",
      familyName: `Episodes-${randomUUID().slice(0, 8)}`,
      healthRecordNumber: `EP-${randomUUID()}`,
      dateOfBirth: "1950-05-05",
      sex: opts.sex ?? "male",
      allergyLatex: opts.latex === "not-asked" ? "not-asked" : opts.latex ? "yes" : "no",
      allergyChlorhexidine: "no",
      allergyLidocaine: "no",
    })
    .returning({ id: patients.id });
  created.push(p.id);
  for (const org of opts.teams ?? [harbourside]) await db.insert(careTeam).values({ patientId: p.id, organisationId: org });
  return p.id;
}

async function counts(patientId: string) {
  const [e] = await db.select({ n: count() }).from(catheterEpisodes).where(eq(catheterEpisodes.patientId, patientId));
  const [v] = await db.select({ n: count() }).from(episodeEvents).where(eq(episodeEvents.patientId, patientId));
  const [a] = await db.select({ n: count() }).from(auditEvents).where(eq(auditEvents.patientId, patientId));
  const [active] = await db
    .select({ n: count() })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
  return { episodes: e.n, events: v.n, audits: a.n, active: active.n };
}

async function post(handler: unknown, patientId: string, suffix: string, body: unknown, who: keyof typeof demo | null = "communityNurse") {
  const res = await call(h(handler), `/api/patients/${patientId}/episodes${suffix}`, {
    body,
    cookie: who ? await sessionFor(who) : undefined,
    params: { patientId },
  });
  return { status: res.status, body: await res.json() };
}

function addDays(iso: string, days: number) {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}
const londonDate = (iso: string) =>
  new Intl.DateTimeFormat("en-CA", { timeZone: "Europe/London", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date(iso));

beforeAll(async () => {
  const orgs = await db.select({ id: organisations.id, name: organisations.name }).from(organisations);
  harbourside = orgs.find((o) => o.name === "Harbourside Community Nursing Team")!.id;
  larch = orgs.find((o) => o.name === "Larch Ward")!.id;
  const [arthur] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  arthurId = arthur.id;
});

// Other files read the demo caseloads: leave no test patient behind (episodes and events cascade).
afterAll(async () => {
  if (created.length) await db.delete(patients).where(inArray(patients.id, created));
});

describe("POST /api/patients/[patientId]/episodes (insertion)", () => {
  it("records every documentation field, computes the planned dates, writes the event and the audit", async () => {
    const patientId = await makePatient();
    const body = insertionBody();
    const res = await post(postInsertion, patientId, "", body);
    expect(res.status).toBe(201);
    const { episode, eventId, findings } = res.body;
    expect(typeof eventId).toBe("string");
    expect(findings).toEqual([]);
    expect(episode).toMatchObject({
      patientId,
      route: "urethral",
      catheterType: "two-way",
      material: "all-silicone",
      lengthCategory: "standard",
      sizeCh: 14,
      balloonMl: 10,
      makerBalloonMl: 10,
      maker: "Northfen Medical (demo)",
      lot: "AB12",
      expiry: "2028-11-30",
      gtin: "09506000134352",
      serial: "XYZ",
      indication: "Chronic urinary retention",
      insertedByName: "Grace Mensah",
      gelKind: "plain",
      gelVolumeMl: 11,
      residualUrineMl: 350,
      urineDescription: "Clear, straw-coloured",
      specimenTaken: true,
      attempts: 1,
      patientReaction: "Comfortable throughout",
      maxDwellDays: 84,
      reviewIntervalDays: 28,
      removedAt: null,
    });
    // Maker's 84 days from the insertion day; review of need 28 days (planDates, common practice).
    expect(episode.plannedChangeOn).toBe(addDays(londonDate(body.insertedAt), 84));
    expect(episode.reviewDueOn).toBe(addDays(londonDate(body.insertedAt), 28));
    const [row] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, episode.id));
    expect(row.insertedByUserId).toBeTruthy();
    expect(row.organisationId).toBe(harbourside);
    expect(row.udi).toContain("\u001d");
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, eventId));
    expect(event).toMatchObject({ kind: "insertion", episodeId: episode.id, recordedByName: "Grace Mensah" });
    const audits = await db.select().from(auditEvents).where(eq(auditEvents.patientId, patientId));
    expect(audits.map((a) => a.action)).toContain("episode.insert");
  });

  it("prefills nothing it was not given: the material default dwell is used when the maker's is left out", async () => {
    const patientId = await makePatient();
    const body = insertionBody({ material: "ptfe-coated-latex", maxDwellDays: undefined, reviewIntervalDays: undefined });
    const res = await post(postInsertion, patientId, "", body);
    expect(res.status).toBe(201);
    // PTFE-coated latex: 28 days (lib/clinical MATERIAL_SPECS, common practice, no source).
    expect(res.body.episode.plannedChangeOn).toBe(addDays(londonDate(body.insertedAt), 28));
    expect(res.body.episode.maxDwellDays).toBeNull();
  });

  it("refuses bad input with a field error for each problem, and writes nothing", async () => {
    const patientId = await makePatient();
    const before = await counts(patientId);
    const res = await post(postInsertion, patientId, "", {
      ...insertionBody(),
      route: "sideways",
      sizeCh: 99,
      balloonMl: "ten",
      indication: "",
      gelKind: "lidocaine",
      gelVolumeMl: undefined,
      attempts: 0,
      expiry: "2028-02-30",
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_failed");
    expect(Object.keys(res.body.error.fields).sort()).toEqual(
      ["attempts", "balloonMl", "expiry", "gelVolumeMl", "indication", "route", "sizeCh"].sort(),
    );
    expect(res.body.error.fields.sizeCh).toEqual(["range:6:30:ch"]);
    const after = await counts(patientId);
    expect(after).toEqual(before);
  });

  it("refuses an insertion time in the future (400, nothing written)", async () => {
    const patientId = await makePatient();
    const before = await counts(patientId);
    const res = await post(postInsertion, patientId, "", insertionBody({ insertedAt: new Date(Date.now() + 60 * 60_000).toISOString() }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.insertedAt).toEqual(["in_future"]);
    expect(await counts(patientId)).toEqual(before);
  });

  it("refuses a time without its offset, which would be read in the server's zone", async () => {
    const patientId = await makePatient();
    const res = await post(postInsertion, patientId, "", insertionBody({ insertedAt: "2026-01-05T10:30" }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.insertedAt).toEqual(["date_time"]);
  });

  it("answers 409 when a catheter is already in place, and writes nothing", async () => {
    const before = await counts(arthurId);
    const res = await post(postInsertion, arthurId, "", insertionBody());
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("conflict");
    expect(await counts(arthurId)).toEqual(before);
  });

  it("blocks an expired device without an override (400 on overrides.device-expired, nothing written)", async () => {
    const patientId = await makePatient();
    const before = await counts(patientId);
    const res = await post(postInsertion, patientId, "", insertionBody({ expiry: "2020-01-31" }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ "overrides.device-expired": ["override_required"] });
    expect(await counts(patientId)).toEqual(before);
  });

  it("refuses an override reason shorter than 10 characters", async () => {
    const patientId = await makePatient();
    const res = await post(postInsertion, patientId, "", insertionBody({ expiry: "2020-01-31", overrides: [{ code: "device-expired", reason: "ok" }] }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields["overrides.0.reason"]).toEqual(["too_short"]);
    expect((await counts(patientId)).episodes).toBe(0);
  });

  it("saves an expired device with an override reason, and keeps the reason on the episode and the event", async () => {
    const patientId = await makePatient();
    const reason = "Only catheter on the ward at night; replaced at the first visit tomorrow";
    const res = await post(postInsertion, patientId, "", insertionBody({ expiry: "2020-01-31", overrides: [{ code: "device-expired", reason }] }));
    expect(res.status).toBe(201);
    expect(res.body.findings.map((f: { code: string }) => f.code)).toContain("device-expired");
    expect(res.body.episode.overrides).toEqual([{ code: "device-expired", reason }]);
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, res.body.eventId));
    expect(event.details.overrides).toEqual([{ code: "device-expired", reason, byName: "Grace Mensah" }]);
  });

  it("keeps only the overrides that answer a stop finding", async () => {
    const patientId = await makePatient();
    const res = await post(
      postInsertion,
      patientId,
      "",
      insertionBody({ overrides: [{ code: "latex-allergy", reason: "Not relevant to this all-silicone catheter" }] }),
    );
    expect(res.status).toBe(201);
    expect(res.body.episode.overrides).toEqual([]);
  });

  it("lets a clinician with visit access record (visit access is logged as such)", async () => {
    const patientId = await makePatient();
    const [rowan] = await db.select({ id: user.id }).from(user).where(eq(user.email, demo.rowanNurse.email));
    await db.insert(visitAccess).values({ patientId, userId: rowan.id, reason: "Out-of-hours visit", expiresAt: new Date(Date.now() + 3600_000) });
    const res = await post(postInsertion, patientId, "", insertionBody(), "rowanNurse");
    expect(res.status).toBe(201);
    const audits = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, patientId), eq(auditEvents.action, "episode.insert")));
    expect(audits[0].via).toBe("visit_access");
  });
});

describe("POST …/episodes/check", () => {
  it("returns the stop for a latex catheter for Arthur Pell (latex allergy) and writes no episode", async () => {
    const before = await counts(arthurId);
    const res = await post(postCheck, arthurId, "/check", { ...insertionBody({ material: "hydrogel-coated-latex" }) });
    expect(res.status).toBe(200);
    expect(res.body.stopCodes).toEqual(["latex-allergy"]);
    expect(res.body.findings[0]).toMatchObject({ severity: "stop", code: "latex-allergy", source: "latex-ask-before" });
    const after = await counts(arthurId);
    expect(after.episodes).toBe(before.episodes);
    expect(after.events).toBe(before.events);
  });

  it("warns that latex allergy is not recorded when nobody asked, and says nothing when the answer is no", async () => {
    const unasked = await makePatient({ latex: "not-asked" });
    const res = await post(postCheck, unasked, "/check", insertionBody({ material: "hydrogel-coated-latex" }));
    expect(res.status).toBe(200);
    const codes = res.body.findings.map((f: { code: string }) => f.code);
    expect(codes).toContain("latex-allergy-unknown");
    expect(codes).not.toContain("latex-allergy");
    const asked = await makePatient({ latex: false });
    const none = await post(postCheck, asked, "/check", insertionBody({ material: "hydrogel-coated-latex" }));
    expect(none.body.findings.map((f: { code: string }) => f.code)).not.toContain("latex-allergy-unknown");
  });

  it("refuses an incomplete draft with field errors", async () => {
    const res = await post(postCheck, arthurId, "/check", { route: "urethral" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.sizeCh).toBeTruthy();
  });
});

describe("POST …/episodes/change", () => {
  async function patientWithCatheter(opts: Parameters<typeof makePatient>[0] = {}) {
    const patientId = await makePatient(opts);
    const res = await post(postInsertion, patientId, "", insertionBody({ insertedAt: minutesAgo(600) }));
    expect(res.status).toBe(201);
    return { patientId, episodeId: res.body.episode.id as string };
  }

  it("ends the catheter in place and starts the new one (planned change)", async () => {
    const { patientId, episodeId } = await patientWithCatheter();
    const insertedAt = hourAgo();
    const res = await post(postChange, patientId, "/change", { ...insertionBody({ insertedAt, lot: "CD34" }), changeKind: "planned", needReviewed: true });
    expect(res.status).toBe(201);
    expect(res.body.previousEpisodeId).toBe(episodeId);
    expect(res.body.episode.previousEpisodeId).toBe(episodeId);
    const [old] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, episodeId));
    expect(old.removedAt?.toISOString()).toBe(insertedAt);
    expect(old.removalReason).toBe("planned change");
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, res.body.eventId));
    expect(event).toMatchObject({ kind: "planned_change", reason: null, episodeId: res.body.episode.id });
    expect(event.details).toMatchObject({ previousEpisodeId: episodeId, needReviewed: true });
    expect((await counts(patientId)).active).toBe(1);
  });

  it("records an unplanned change with its reason and notes", async () => {
    const { patientId, episodeId } = await patientWithCatheter();
    const res = await post(postChange, patientId, "/change", {
      ...insertionBody(),
      changeKind: "unplanned",
      unplannedReason: "other",
      reasonNotes: "Balloon would not hold water",
    });
    expect(res.status).toBe(201);
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, res.body.eventId));
    expect(event).toMatchObject({ kind: "unplanned_change", reason: "other", notes: "Balloon would not hold water" });
    const [old] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, episodeId));
    expect(old.removalReason).toBe("other");
  });

  it("refuses an unplanned change without a reason (400, nothing written)", async () => {
    const { patientId } = await patientWithCatheter();
    const before = await counts(patientId);
    const res = await post(postChange, patientId, "/change", { ...insertionBody(), changeKind: "unplanned" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.unplannedReason).toEqual(["unplanned_reason_required"]);
    expect(await counts(patientId)).toEqual(before);
  });

  it("asks for notes when the reason is other", async () => {
    const { patientId } = await patientWithCatheter();
    const res = await post(postChange, patientId, "/change", { ...insertionBody(), changeKind: "unplanned", unplannedReason: "other" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.reasonNotes).toEqual(["notes_required"]);
  });

  it("refuses a change timed before the catheter in place went in", async () => {
    const { patientId } = await patientWithCatheter();
    const before = await counts(patientId);
    const res = await post(postChange, patientId, "/change", { ...insertionBody({ insertedAt: minutesAgo(900) }), changeKind: "planned" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.insertedAt).toEqual(["before_insertion"]);
    expect(await counts(patientId)).toEqual(before);
  });

  it("answers 409 when no catheter is in place", async () => {
    const patientId = await makePatient();
    const res = await post(postChange, patientId, "/change", { ...insertionBody(), changeKind: "planned" });
    expect(res.status).toBe(409);
    expect((await counts(patientId)).episodes).toBe(0);
  });

  it("blocks a latex catheter for Arthur Pell (latex allergy) without an override: 400, his catheter untouched", async () => {
    const before = await counts(arthurId);
    const [current] = await db
      .select()
      .from(catheterEpisodes)
      .where(and(eq(catheterEpisodes.patientId, arthurId), isNull(catheterEpisodes.removedAt)));
    const res = await post(postChange, arthurId, "/change", { ...insertionBody({ material: "silicone-coated-latex" }), changeKind: "planned" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ "overrides.latex-allergy": ["override_required"] });
    expect(await counts(arthurId)).toEqual(before);
    const [still] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, current.id));
    expect(still.removedAt).toBeNull();
  });

  it("saves a latex catheter for a latex-allergic patient only with an override, and keeps it", async () => {
    // A latex-allergic patient of our own, so Arthur Pell's demo record stays as seeded.
    const { patientId } = await patientWithCatheter({ latex: true });
    const reason = "Allergy recorded in error: confirmed negative by the allergy clinic today";
    const res = await post(postChange, patientId, "/change", {
      ...insertionBody({ material: "silicone-coated-latex", overrides: [{ code: "latex-allergy", reason }] }),
      changeKind: "planned",
    });
    expect(res.status).toBe(201);
    expect(res.body.episode.overrides).toEqual([{ code: "latex-allergy", reason }]);
    expect(res.body.findings[0]).toMatchObject({ severity: "stop", code: "latex-allergy" });
    const [row] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, res.body.episode.id));
    expect(row.overrides).toEqual([{ code: "latex-allergy", reason }]);
    expect((row.findings as { code: string }[]).map((f) => f.code)).toContain("latex-allergy");
  });
});

describe("POST …/episodes/removal and …/twoc", () => {
  async function patientWithCatheter() {
    const patientId = await makePatient();
    const res = await post(postInsertion, patientId, "", insertionBody({ insertedAt: minutesAgo(600) }));
    expect(res.status).toBe(201);
    return { patientId, episodeId: res.body.episode.id as string };
  }

  it("records a removal with its reason", async () => {
    const { patientId, episodeId } = await patientWithCatheter();
    const removedAt = minutesAgo(30);
    const res = await post(postRemoval, patientId, "/removal", { removedAt, reason: "no-longer-needed", balloonDeflatedMl: 10 });
    expect(res.status).toBe(201);
    expect(res.body.episode).toMatchObject({ id: episodeId, removedAt, removalReason: "no-longer-needed", awaitingTwoc: false });
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, res.body.eventId));
    expect(event).toMatchObject({ kind: "removal", episodeId });
    expect(event.details).toMatchObject({ reason: "no-longer-needed", startTwoc: false, balloonDeflatedMl: 10, catheterIntact: true });
    expect((await counts(patientId)).active).toBe(0);
  });

  it("refuses a removal without a reason, or before the insertion, or in the future; nothing written", async () => {
    const { patientId } = await patientWithCatheter();
    const before = await counts(patientId);
    const noReason = await post(postRemoval, patientId, "/removal", { removedAt: minutesAgo(5) });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toEqual(["choose_one"]);
    const early = await post(postRemoval, patientId, "/removal", { removedAt: minutesAgo(700), reason: "no-longer-needed" });
    expect(early.status).toBe(400);
    expect(early.body.error.fields.removedAt).toEqual(["before_insertion"]);
    const future = await post(postRemoval, patientId, "/removal", { removedAt: new Date(Date.now() + 3600_000).toISOString(), reason: "other", notes: "x" });
    expect(future.status).toBe(400);
    expect(future.body.error.fields.removedAt).toEqual(["in_future"]);
    expect(await counts(patientId)).toEqual(before);
  });

  it("answers 409 for a removal when nothing is in place", async () => {
    const patientId = await makePatient();
    const res = await post(postRemoval, patientId, "/removal", { removedAt: minutesAgo(5), reason: "no-longer-needed" });
    expect(res.status).toBe(409);
  });

  it("starts a trial without catheter at removal; a passed trial closes it", async () => {
    const { patientId, episodeId } = await patientWithCatheter();
    const removal = await post(postRemoval, patientId, "/removal", { removedAt: minutesAgo(300), reason: "trial-without-catheter", startTwoc: true });
    expect(removal.status).toBe(201);
    expect(removal.body.episode.awaitingTwoc).toBe(true);
    const res = await post(postTwoc, patientId, "/twoc", {
      occurredAt: minutesAgo(10),
      outcome: "passed",
      voids: [{ volumeMl: 220 }, { volumeMl: 310 }],
      postVoidResidualMl: 60,
      notes: "Voiding well",
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ episodeId, outcome: "passed", totalVoidedMl: 530, next: null });
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.id, res.body.eventId));
    expect(event).toMatchObject({ kind: "twoc_outcome", twocOutcome: "passed", notes: "Voiding well" });
    expect(event.details).toMatchObject({ voidsMl: [220, 310], totalVoidedMl: 530, postVoidResidualMl: 60 });
    const [ep] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, episodeId));
    expect(ep.awaitingTwoc).toBe(false);
    // The trial is over: a second outcome has nothing to attach to.
    const again = await post(postTwoc, patientId, "/twoc", { occurredAt: minutesAgo(5), outcome: "passed" });
    expect(again.status).toBe(409);
  });

  it("a failed trial needs what was done; re-catheterised leads to the insertion form", async () => {
    const { patientId } = await patientWithCatheter();
    await post(postRemoval, patientId, "/removal", { removedAt: minutesAgo(400), reason: "trial-without-catheter" });
    const before = await counts(patientId);
    const missing = await post(postTwoc, patientId, "/twoc", { occurredAt: minutesAgo(20), outcome: "failed" });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields.failedAction).toEqual(["failed_action_required"]);
    expect(await counts(patientId)).toEqual(before);
    const res = await post(postTwoc, patientId, "/twoc", {
      occurredAt: minutesAgo(20),
      outcome: "failed",
      failedAction: "re-catheterised",
      voids: [{ volumeMl: 40 }],
      postVoidResidualMl: 650,
    });
    expect(res.status).toBe(201);
    expect(res.body.next).toBe("insertion");
    const insertion = await post(postInsertion, patientId, "", insertionBody({ insertedAt: minutesAgo(10) }));
    expect(insertion.status).toBe(201);
  });

  it("refuses a TWOC outcome when no trial is under way, or timed before the removal", async () => {
    const { patientId } = await patientWithCatheter();
    const inPlace = await post(postTwoc, patientId, "/twoc", { occurredAt: minutesAgo(5), outcome: "passed" });
    expect(inPlace.status).toBe(409);
    await post(postRemoval, patientId, "/removal", { removedAt: minutesAgo(60), reason: "trial-without-catheter" });
    const early = await post(postTwoc, patientId, "/twoc", { occurredAt: minutesAgo(120), outcome: "passed" });
    expect(early.status).toBe(400);
    expect(early.body.error.fields.occurredAt).toEqual(["before_removal"]);
  });
});

describe("who may record (ASVS 8.2.1 function level, 8.2.2 data level, 8.4.1 organisations)", () => {
  it("a ward nurse of Larch gets 404 on a Harbourside-only patient, for every route, and nothing is written", async () => {
    const patientId = await makePatient({ teams: [harbourside] });
    const before = await counts(patientId);
    for (const r of routes) {
      const res = await post(r.handler, patientId, r.suffix, insertionBody(), "wardNurse");
      expect(res.status, r.name).toBe(404);
      expect(res.body.error.code).toBe("not_found");
    }
    expect(await counts(patientId)).toEqual(before);
  });

  it("a ward nurse of Larch may record for a patient Larch shares", async () => {
    const patientId = await makePatient({ teams: [larch, harbourside] });
    const res = await post(postInsertion, patientId, "", insertionBody(), "wardNurse");
    expect(res.status).toBe(201);
    const [row] = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, res.body.episode.id));
    expect(row.organisationId).toBe(larch);
  });

  it("an unknown or malformed patient id answers 404", async () => {
    for (const id of [randomUUID(), "not-a-uuid"]) {
      const res = await post(postInsertion, id, "", insertionBody());
      expect(res.status).toBe(404);
    }
  });

  for (const who of ["patient", "carer", "admin"] as const) {
    it(`${who} gets 403 on every route, even for their own record`, async () => {
      const before = await counts(arthurId);
      for (const r of routes) {
        const res = await post(r.handler, arthurId, r.suffix, insertionBody(), who);
        expect(res.status, r.name).toBe(403);
      }
      expect((await counts(arthurId)).episodes).toBe(before.episodes);
    });
  }

  it("anonymous gets 401 on every route", async () => {
    for (const r of routes) {
      const res = await post(r.handler, arthurId, r.suffix, insertionBody(), null);
      expect(res.status, r.name).toBe(401);
    }
  });

  it("refuses a cross-site request before anything else", async () => {
    const patientId = await makePatient();
    const res = await call(h(postInsertion), `/api/patients/${patientId}/episodes`, {
      body: insertionBody(),
      cookie: await sessionFor("communityNurse"),
      params: { patientId },
      headers: { origin: "https://evil.example" },
    });
    expect(res.status).toBe(403);
    expect((await counts(patientId)).episodes).toBe(0);
  });
});
