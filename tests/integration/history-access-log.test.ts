// History (episodes, events, blockage pattern) and the access log of a record: content, order,
// pages and the access matrix (ASVS 8.2.2; the log itself: ASVS 16.2.1).
import { beforeAll, describe, expect, it } from "vitest";
import { GET as accessLog } from "@/app/api/patients/[patientId]/access-log/route";
import { GET as history } from "@/app/api/patients/[patientId]/history/route";
import { GET as getPatient } from "@/app/api/patients/[patientId]/route";
import { grantVisitAccess, patientIdByHrn, userIdByEmail } from "../support/fixtures";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { auditEvents, user } from "@/db/schema";
import { call, demo, sessionFor } from "../support/http";

let halina: string;
let maria: string;
beforeAll(async () => {
  halina = await patientIdByHrn("EM-100-002");
  maria = await patientIdByHrn("EM-100-004");
});

describe("GET /api/patients/[patientId]/history", () => {
  it("lists Halina Nowak's catheters newest first with dwell days, why each ended, and who inserted it", async () => {
    const res = await call(history, `/api/patients/${halina}/history`, { cookie: await sessionFor("communityNurse"), params: { patientId: halina } });
    expect(res.status).toBe(200);
    const body = await res.json();
    // Seed: inserted 120, 99, 78, 57 and 36 days ago; each of the first four blocked after 21 days.
    expect(body.episodes.map((e: { dwellDays: number }) => e.dwellDays)).toEqual([36, 21, 21, 21, 21]);
    expect(body.episodes.map((e: { endReason: string | null }) => e.endReason)).toEqual([null, "blockage", "blockage", "blockage", "blockage"]);
    expect(body.episodes[0].inPlace).toBe(true);
    const starts = body.episodes.map((e: { insertedAt: string }) => e.insertedAt);
    expect(starts).toEqual([...starts].sort().reverse());
    expect(body.episodes[0].events[0]).toMatchObject({ kind: "unplanned_change", reason: "blockage", recordedByName: "Grace Mensah" });
    expect(body.episodes.at(-1).events[0].kind).toBe("insertion");
  });

  it("finds her blockage pattern: typical life 21 days, planned change every 18 days", async () => {
    const res = await call(history, `/api/patients/${halina}/history`, { cookie: await sessionFor("communityNurse"), params: { patientId: halina } });
    const { blockage } = await res.json();
    // lib/clinical blockagePattern: median of blocked dwells (21) minus a 3-day margin (common practice, no source).
    expect(blockage).toMatchObject({ status: "pattern", blockageEpisodes: 4, typicalDwellDays: 21, suggestedIntervalDays: 18, atFloor: false });
  });

  it("says there is not enough history for a patient with one catheter", async () => {
    const res = await call(history, `/api/patients/${maria}/history`, { cookie: await sessionFor("wardNurse"), params: { patientId: maria } });
    const body = await res.json();
    expect(body.episodes).toHaveLength(1);
    expect(body.blockage).toEqual({ status: "insufficient", blockageEpisodes: 0, needed: 3 });
  });

  it("404 for another organisation's clinician; 401 anonymous; 403 patient, carer, admin", async () => {
    const path = `/api/patients/${halina}/history`;
    expect((await call(history, path, { cookie: await sessionFor("wardNurse"), params: { patientId: halina } })).status).toBe(404);
    expect((await call(history, path, { params: { patientId: halina } })).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      expect((await call(history, path, { cookie: await sessionFor(who), params: { patientId: halina } })).status, who).toBe(403);
    }
  });
});

describe("GET /api/patients/[patientId]/access-log", () => {
  it("shows every audit event for the patient, newest first, with who (name and role), what and how; tab views run together", async () => {
    const nurse = await sessionFor("communityNurse");
    await call(getPatient, `/api/patients/${halina}`, { cookie: nurse, params: { patientId: halina } });
    await call(history, `/api/patients/${halina}/history`, { cookie: nurse, params: { patientId: halina } });
    const res = await call(accessLog, `/api/patients/${halina}/access-log`, { cookie: nurse, params: { patientId: halina } });
    expect(res.status).toBe(200);
    const body = await res.json();
    // Details, history and the log itself, seconds apart: one line, "viewed the record 3 times".
    expect(body.entries[0]).toMatchObject({ action: "patient.view", actorName: "Grace Mensah", actorRole: "clinician", via: "care_team" });
    expect(body.entries[0].count).toBeGreaterThanOrEqual(3);
    expect(new Date(body.entries[0].firstAt).getTime()).toBeLessThanOrEqual(new Date(body.entries[0].at).getTime());
    const times = body.entries.map((e: { at: string }) => e.at);
    expect(times).toEqual([...times].sort().reverse());
    expect(JSON.stringify(body)).not.toMatch(/ipHash|ip_hash/);
  });

  it("68 tab views in 10 minutes are one line; a change between them stays its own line; views an hour apart are two", async () => {
    const [grace] = await db.select({ id: user.id }).from(user).where(eq(user.email, demo.communityNurse.email));
    const at = (minutesAgo: number) => new Date(Date.now() - minutesAgo * 60_000);
    const tabs = ["patient.view.device", "patient.view.history", "patient.view.check-ins", "patient.view.letters"];
    await db.insert(auditEvents).values([
      ...Array.from({ length: 68 }, (_, i) => ({ action: tabs[i % 4], actorUserId: grace.id, actorRole: "clinician", patientId: maria, via: "care_team" as const, at: at(200 - (i * 10) / 68) })),
      { action: "patient.update", actorUserId: grace.id, actorRole: "clinician", patientId: maria, via: "care_team" as const, at: at(195) },
      { action: "patient.view.device", actorUserId: grace.id, actorRole: "clinician", patientId: maria, via: "care_team" as const, at: at(120) },
    ]);
    const log = await (await call(accessLog, `/api/patients/${maria}/access-log?pageSize=100`, { cookie: await sessionFor("communityNurse"), params: { patientId: maria } })).json();
    const mine = log.entries.filter((e: { at: string }) => Date.now() - new Date(e.at).getTime() > 100 * 60_000 && Date.now() - new Date(e.at).getTime() < 210 * 60_000);
    expect(mine.map((e: { action: string; count: number }) => [e.action, e.count])).toEqual([
      ["patient.view.device", 1],
      ["patient.view", 68],
      ["patient.update", 1],
    ]);
  });

  it("pages the log", async () => {
    const nurse = await sessionFor("communityNurse");
    const p1 = await (await call(accessLog, `/api/patients/${maria}/access-log?pageSize=2`, { cookie: nurse, params: { patientId: maria } })).json();
    const p2 = await (await call(accessLog, `/api/patients/${maria}/access-log?pageSize=2&page=2`, { cookie: nurse, params: { patientId: maria } })).json();
    expect(p1.entries).toHaveLength(2);
    expect(p2.entries.length).toBeGreaterThan(0);
    expect(p2.entries[0].id).not.toBe(p1.entries[0].id);
    expect(p2.total).toBeGreaterThanOrEqual(p1.total);
    const far = await (await call(accessLog, `/api/patients/${maria}/access-log?pageSize=2&page=999`, { cookie: nurse, params: { patientId: maria } })).json();
    expect(far.entries).toEqual([]);
    expect(far.total).toBeGreaterThan(2);
    const bad = await call(accessLog, `/api/patients/${maria}/access-log?pageSize=500`, { cookie: nurse, params: { patientId: maria } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.fields.pageSize).toBeDefined();
  });

  it("records visit access as such, keeps the log for the care team only, and filters people outside the care team", async () => {
    const rowan = await userIdByEmail(demo.rowanNurse.email);
    const yusuf = await patientIdByHrn("EM-100-003");
    const visitor = await sessionFor("rowanNurse");
    expect((await call(accessLog, `/api/patients/${yusuf}/access-log`, { cookie: visitor, params: { patientId: yusuf } })).status).toBe(404);
    const revoke = await grantVisitAccess({ patientId: yusuf, userId: rowan });
    try {
      expect((await call(history, `/api/patients/${yusuf}/history`, { cookie: visitor, params: { patientId: yusuf } })).status).toBe(200);
      expect((await call(accessLog, `/api/patients/${yusuf}/access-log`, { cookie: visitor, params: { patientId: yusuf } })).status).toBe(403);
    } finally {
      await revoke();
    }
    const nurse = await sessionFor("communityNurse");
    const log = await (await call(accessLog, `/api/patients/${yusuf}/access-log`, { cookie: nurse, params: { patientId: yusuf } })).json();
    const visit = log.entries.find((e: { actorName: string; via: string }) => e.actorName === "Priya Sandhu" && e.via === "visit_access");
    expect(visit).toMatchObject({ via: "visit_access", actorRole: "clinician" });
    const outside = await (await call(accessLog, `/api/patients/${yusuf}/access-log?who=outside`, { cookie: nurse, params: { patientId: yusuf } })).json();
    expect(outside.filter).toBe("outside");
    expect(outside.entries.length).toBeGreaterThan(0);
    expect(outside.entries.every((e: { via: string | null }) => e.via !== "care_team" && e.via !== "system")).toBe(true);
    expect(outside.entries.some((e: { actorName: string }) => e.actorName === "Priya Sandhu")).toBe(true);
    expect(outside.total).toBeLessThan(log.total);
  });

  it("401 anonymous; 403 carer and admin; another patient's record is 404 to a patient", async () => {
    const path = `/api/patients/${halina}/access-log`;
    expect((await call(accessLog, path, { params: { patientId: halina } })).status).toBe(401);
    for (const who of ["carer", "admin"] as const) {
      expect((await call(accessLog, path, { cookie: await sessionFor(who), params: { patientId: halina } })).status, who).toBe(403);
    }
    expect((await call(accessLog, path, { cookie: await sessionFor("patient"), params: { patientId: halina } })).status).toBe(404);
  });
});
