// Registering and editing a patient: the access matrix (ASVS 8.2.1, 8.2.2), field errors with
// nothing written (ASVS 2.2.2), a duplicate record number as a field error, not a 500.
import { and, count, desc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as gpPractices } from "@/app/api/gp-practices/route";
import { GET as getPatient, PATCH as patchPatient } from "@/app/api/patients/[patientId]/route";
import { POST as createPatient } from "@/app/api/patients/route";
import { db } from "@/db";
import { auditEvents, careTeam, organisations, patients } from "@/db/schema";
import { clinicianInNewTeam, grantVisitAccess, patientIdByHrn, userIdByEmail, type ClinicianFixture } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";

let fixture: ClinicianFixture;
let millbrook: string;
let rowanWard: string;

beforeAll(async () => {
  fixture = await clinicianInNewTeam("Register");
  const orgs = await db.select({ id: organisations.id, name: organisations.name }).from(organisations);
  millbrook = orgs.find((o) => o.name === "Millbrook Surgery")!.id;
  rowanWard = orgs.find((o) => o.name === "Rowan Ward")!.id;
});
afterAll(async () => {
  await fixture?.cleanup();
});

function valid(overrides: Record<string, unknown> = {}) {
  return {
    givenName: "Edwin",
    familyName: "Marsh",
    healthRecordNumber: " tst-0001 ",
    dateOfBirth: "1941-05-17",
    sex: "male",
    preferredLocale: "en",
    weightKg: 71.5,
    allergies: { latex: "yes", chlorhexidine: "no", lidocaine: "not-asked", other: "Penicillin" },
    gpPracticeId: millbrook,
    careTeamOrganisationIds: [fixture.organisationId],
    ...overrides,
  };
}

async function patientCount() {
  const [{ n }] = await db.select({ n: count() }).from(patients);
  return n;
}

describe("POST /api/patients", () => {
  let createdId: string;

  it("registers the patient with the care team, trims and upper-cases the record number, and audits", async () => {
    const res = await call(createPatient, "/api/patients", { cookie: fixture.cookie, body: valid() });
    expect(res.status, await res.clone().text()).toBe(201);
    const body = await res.json();
    createdId = body.patient.id;
    const [row] = await db.select().from(patients).where(eq(patients.id, createdId));
    expect(row).toMatchObject({ healthRecordNumber: "TST-0001", givenName: "Edwin", weightKg: 71.5, allergyLatex: "yes", allergyChlorhexidine: "no", allergyLidocaine: "not-asked", allergyOther: "Penicillin", gpPracticeId: millbrook });
    const team = await db.select().from(careTeam).where(eq(careTeam.patientId, createdId));
    expect(team.map((t) => t.organisationId)).toEqual([fixture.organisationId]);
    const events = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, createdId), eq(auditEvents.action, "patient.create")));
    expect(events).toHaveLength(1);
    expect(events[0]).toMatchObject({ actorUserId: fixture.userId, actorRole: "clinician", via: "care_team" });
  });

  it("400 with every field error and nothing written", async () => {
    const before = await patientCount();
    const res = await call(createPatient, "/api/patients", {
      cookie: fixture.cookie,
      body: valid({
        givenName: "  ",
        healthRecordNumber: "a!",
        dateOfBirth: "2999-01-01",
        sex: "x",
        preferredLocale: "de",
        weightKg: 401,
        gpPracticeId: "nope",
        careTeamOrganisationIds: [],
      }),
    });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.code).toBe("validation_failed");
    expect(error.fields).toMatchObject({
      givenName: ["required"],
      healthRecordNumber: ["hrn_format"],
      dateOfBirth: ["dob_future"],
      sex: ["required"],
      preferredLocale: ["required"],
      weightKg: ["range:1:400:kg"],
      gpPracticeId: ["gp_required"],
      careTeamOrganisationIds: ["care_team_required"],
    });
    expect(await patientCount()).toBe(before);
  });

  it("refuses a birth date before 1900, a weight below 1 kg and a record number of 21 characters", async () => {
    const res = await call(createPatient, "/api/patients", {
      cookie: fixture.cookie,
      body: valid({ dateOfBirth: "1899-12-31", weightKg: 0.5, healthRecordNumber: "A".repeat(21) }),
    });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.fields).toEqual({ dateOfBirth: ["dob_too_early"], weightKg: ["range:1:400:kg"], healthRecordNumber: ["hrn_format"] });
  });

  it("409 with a field error for a health record number already registered, and nothing written", async () => {
    const before = await patientCount();
    const res = await call(createPatient, "/api/patients", { cookie: fixture.cookie, body: valid({ healthRecordNumber: "em-100-001" }) });
    expect(res.status).toBe(409);
    const { error } = await res.json();
    expect(error.code).toBe("conflict");
    expect(error.fields).toEqual({ healthRecordNumber: ["hrn_taken"] });
    expect(await patientCount()).toBe(before);
  });

  it("400 when the care team is not one of my organisations, or the GP is not a practice", async () => {
    const before = await patientCount();
    const notMine = await call(createPatient, "/api/patients", {
      cookie: fixture.cookie,
      body: valid({ healthRecordNumber: "TST-0002", careTeamOrganisationIds: [fixture.organisationId, rowanWard] }),
    });
    expect(notMine.status).toBe(400);
    expect((await notMine.json()).error.fields).toEqual({ careTeamOrganisationIds: ["care_team_not_yours"] });
    const notGp = await call(createPatient, "/api/patients", {
      cookie: fixture.cookie,
      body: valid({ healthRecordNumber: "TST-0003", gpPracticeId: rowanWard }),
    });
    expect(notGp.status).toBe(400);
    expect((await notGp.json()).error.fields).toEqual({ gpPracticeId: ["gp_unknown"] });
    expect(await patientCount()).toBe(before);
  });

  it("401 anonymous; 403 for patient, carer and admin; 403 from another site; nothing written", async () => {
    const before = await patientCount();
    expect((await call(createPatient, "/api/patients", { body: valid({ healthRecordNumber: "TST-0004" }) })).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      const res = await call(createPatient, "/api/patients", { cookie: await sessionFor(who), body: valid({ healthRecordNumber: "TST-0004" }) });
      expect(res.status, who).toBe(403);
    }
    const crossSite = await call(createPatient, "/api/patients", {
      cookie: fixture.cookie,
      body: valid({ healthRecordNumber: "TST-0004" }),
      headers: { origin: "https://elsewhere.example" },
    });
    expect(crossSite.status).toBe(403);
    expect(await patientCount()).toBe(before);
  });

  it("415 for a body that is not JSON", async () => {
    const res = await call(createPatient, "/api/patients", { cookie: fixture.cookie, rawBody: "givenName=x", headers: { "content-type": "application/x-www-form-urlencoded" } });
    expect(res.status).toBe(415);
  });

  describe("GET and PATCH /api/patients/[patientId]", () => {
    const path = () => `/api/patients/${createdId}`;
    const params = () => ({ patientId: createdId });

    it("GET returns the details DTO to the care team, and audits the view", async () => {
      const res = await call(getPatient, path(), { cookie: fixture.cookie, params: params() });
      expect(res.status).toBe(200);
      const body = await res.json();
      expect(body.patient).toMatchObject({
        id: createdId,
        healthRecordNumber: "TST-0001",
        allergies: { latex: "yes", chlorhexidine: "no", lidocaine: "not-asked", other: "Penicillin" },
        gpPractice: { id: millbrook, name: "Millbrook Surgery" },
      });
      expect(body.patient.careTeam.map((o: { id: string }) => o.id)).toEqual([fixture.organisationId]);
      expect(body.currentEpisode).toBeNull();
      expect(JSON.stringify(body)).not.toMatch(/userId|password|token/i);
      const [event] = await db.select().from(auditEvents).where(eq(auditEvents.patientId, createdId)).orderBy(desc(auditEvents.id)).limit(1);
      expect(event.action).toBe("patient.view.details");
    });

    it("GET of a demo patient returns the catheter in place", async () => {
      const arthur = await patientIdByHrn("EM-100-001");
      const res = await call(getPatient, `/api/patients/${arthur}`, { cookie: await sessionFor("communityNurse"), params: { patientId: arthur } });
      const body = await res.json();
      expect(body.currentEpisode).toMatchObject({ route: "urethral", sizeCh: 14, balloonMl: 10, lot: "AP7731" });
      expect(body.patient.allergies).toMatchObject({ latex: "yes", chlorhexidine: "no", lidocaine: "no" });
    });

    it("404 for a clinician of another organisation, the same as for no patient at all (ASVS 8.2.2)", async () => {
      const other = await sessionFor("rowanNurse");
      const res = await call(getPatient, path(), { cookie: other, params: params() });
      const missing = await call(getPatient, "/api/patients/00000000-0000-4000-8000-000000000000", {
        cookie: other,
        params: { patientId: "00000000-0000-4000-8000-000000000000" },
      });
      const garbage = await call(getPatient, "/api/patients/1%20or%201=1", { cookie: other, params: { patientId: "1 or 1=1" } });
      expect([res.status, missing.status, garbage.status]).toEqual([404, 404, 404]);
      expect(await res.json()).toEqual(await missing.json());
      const patch = await call(patchPatient, path(), { cookie: other, params: params(), method: "PATCH", body: { weightKg: 50 } });
      expect(patch.status).toBe(404);
      const [row] = await db.select({ w: patients.weightKg }).from(patients).where(eq(patients.id, createdId));
      expect(row.w).toBe(71.5);
    });

    it("401 anonymous; 403 for patient, carer and admin (even their own record)", async () => {
      expect((await call(getPatient, path(), { params: params() })).status).toBe(401);
      const arthur = await patientIdByHrn("EM-100-001");
      for (const who of ["patient", "carer", "admin"] as const) {
        const cookie = await sessionFor(who);
        expect((await call(getPatient, `/api/patients/${arthur}`, { cookie, params: { patientId: arthur } })).status, who).toBe(403);
        expect(
          (await call(patchPatient, `/api/patients/${arthur}`, { cookie, params: { patientId: arthur }, method: "PATCH", body: { weightKg: 50 } })).status,
          who,
        ).toBe(403);
      }
    });

    it("PATCH changes only the given fields and audits them", async () => {
      const res = await call(patchPatient, path(), {
        cookie: fixture.cookie,
        params: params(),
        method: "PATCH",
        body: { weightKg: 69, allergies: { latex: "yes", chlorhexidine: "yes", lidocaine: "no", other: "" } },
      });
      expect(res.status, await res.clone().text()).toBe(200);
      const body = await res.json();
      expect(body.patient).toMatchObject({ weightKg: 69, givenName: "Edwin", allergies: { chlorhexidine: "yes", other: null } });
      const [event] = await db
        .select()
        .from(auditEvents)
        .where(and(eq(auditEvents.patientId, createdId), eq(auditEvents.action, "patient.update")))
        .orderBy(desc(auditEvents.id))
        .limit(1);
      expect(event.details).toEqual({ fields: ["weightKg", "allergies"] });
    });

    it("PATCH: 400 with field errors and nothing changed; an empty change is refused", async () => {
      const res = await call(patchPatient, path(), {
        cookie: fixture.cookie,
        params: params(),
        method: "PATCH",
        body: { weightKg: 69.5, dateOfBirth: "1850-01-01", sex: "female", healthRecordNumber: "" },
      });
      expect(res.status).toBe(400);
      expect(Object.keys((await res.json()).error.fields).sort()).toEqual(["dateOfBirth", "healthRecordNumber"]);
      const [row] = await db.select().from(patients).where(eq(patients.id, createdId));
      expect([row.weightKg, row.sex]).toEqual([69, "male"]);
      const empty = await call(patchPatient, path(), { cookie: fixture.cookie, params: params(), method: "PATCH", body: {} });
      expect(empty.status).toBe(400);
      expect((await empty.json()).error.fields).toEqual({ _form: ["nothing_to_change"] });
    });

    it("PATCH: 409 field error for another patient's record number, nothing changed", async () => {
      const res = await call(patchPatient, path(), {
        cookie: fixture.cookie,
        params: params(),
        method: "PATCH",
        body: { healthRecordNumber: "EM-100-002", givenName: "Changed" },
      });
      expect(res.status).toBe(409);
      expect((await res.json()).error.fields).toEqual({ healthRecordNumber: ["hrn_taken"] });
      const [row] = await db.select().from(patients).where(eq(patients.id, createdId));
      expect([row.healthRecordNumber, row.givenName]).toEqual(["TST-0001", "Edwin"]);
    });

    it("visit access lets another clinician read the record but not change the details", async () => {
      const rowanNurse = await userIdByEmail(demo.rowanNurse.email);
      await grantVisitAccess({ patientId: createdId, userId: rowanNurse });
      const cookie = await sessionFor("rowanNurse");
      expect((await call(getPatient, path(), { cookie, params: params() })).status).toBe(200);
      const patch = await call(patchPatient, path(), { cookie, params: params(), method: "PATCH", body: { givenName: "Visitor" } });
      expect(patch.status).toBe(403);
      const [row] = await db.select().from(patients).where(eq(patients.id, createdId));
      expect(row.givenName).toBe("Edwin");
    });
  });
});

describe("GET /api/gp-practices", () => {
  it("lists the GP practices of the directory, and only them, to staff", async () => {
    const res = await call(gpPractices, "/api/gp-practices", { cookie: await sessionFor("communityNurse") });
    expect(res.status).toBe(200);
    const { practices } = await res.json();
    expect(practices.map((p: { name: string }) => p.name)).toEqual(["Millbrook Surgery", "Quayside Practice"]);
  });

  it("401 anonymous, 403 for patient and carer", async () => {
    expect((await call(gpPractices, "/api/gp-practices")).status).toBe(401);
    for (const who of ["patient", "carer"] as const) {
      expect((await call(gpPractices, "/api/gp-practices", { cookie: await sessionFor(who) })).status).toBe(403);
    }
  });
});
