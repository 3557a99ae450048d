// A patient's own data: the JSON export holds every table's rows for that patient (tables found
// from the schema, so a new table is covered) and nothing of any other patient, no secrets;
// closing a record makes it read-only; the retention job removes it after the period and logs it.
import { randomBytes, randomUUID } from "node:crypto";
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as exportData } from "@/app/api/patients/[patientId]/export/route";
import { POST as closeRecord } from "@/app/api/admin/patients/[patientId]/close/route";
import { GET as adminPatients } from "@/app/api/admin/patients/route";
import { db } from "@/db";
import { tablesWithPatientId } from "@/db/queries/patient-export";
import { auditEvents, careTeam, checkIns, diaryEntries, outboundMessages, passports, patients, settings, uploads, user, visitAccess } from "@/db/schema";
import { hashIdentifier, hashToken } from "@/lib/admin/tokens";
import { removeExpiredRecords } from "@/lib/jobs/retention";
import { assertRecordOpen } from "@/lib/record-state";
import { call, sessionFor, signIn } from "../support/http";
import { createOrganisation, createStaff, orgIdsByName, suffix, userIdByEmail } from "../support/staff";

let arthurId: string;
let yusufId: string;
let orgs: Record<string, string>;

/** Rows for a patient in the tables the seed leaves empty, so the export has something in each. */
async function addRowsFor(patientId: string, tag: string) {
  const nurse = await userIdByEmail("community.nurse@eastmere.example");
  await db.insert(diaryEntries).values({ patientId, kind: "in", volumeMl: 250, at: new Date() });
  await db.insert(checkIns).values({ patientId, answers: { tag }, level: "self-care", ruleIds: [], idempotencyKey: `${tag}-${randomUUID()}` });
  await db.insert(passports).values({ patientId, tokenHash: hashToken(randomBytes(32).toString("base64url")), shortCodeHash: hashToken(randomUUID()), languages: ["en"] });
  await db.insert(uploads).values({ patientId, category: "other", objectKey: `test/${randomUUID()}`, label: `${tag}.pdf` });
  await db.insert(outboundMessages).values({ idempotencyKey: `${tag}-${randomUUID()}`, messageId: `<${randomUUID()}@caddis.invalid>`, kind: "test", toAddress: "gp@eastmere.example", subject: tag, html: tag, text: tag, patientId });
  await db.insert(visitAccess).values({ patientId, userId: nurse, reason: tag, expiresAt: new Date(Date.now() + 3600_000) });
}

beforeAll(async () => {
  const rows = await db.select({ id: patients.id, hrn: patients.healthRecordNumber }).from(patients);
  arthurId = rows.find((r) => r.hrn === "EM-100-001")!.id;
  yusufId = rows.find((r) => r.hrn === "EM-100-003")!.id;
  orgs = await orgIdsByName(["Harbourside Community Nursing Team"]);
  await addRowsFor(arthurId, "arthur-row");
  await addRowsFor(yusufId, "yusuf-row");
});

describe("patient data export (JSON)", () => {
  it("finds every table with a patient_id column in the schema", () => {
    const names = tablesWithPatientId().map((t) => t.name);
    expect(names).toEqual(expect.arrayContaining(["care_team", "carer_links", "catheter_episodes", "episode_events", "passports", "check_ins", "diary_entries", "uploads", "outbound_messages", "audit_events", "visit_access"]));
  });

  it("gives the patient every row of every table for them, no other patient's, and no secrets", async () => {
    const cookie = await sessionFor("patient");
    // Counted before the export (which adds its own audit event after reading).
    const counts = new Map<string, number>();
    for (const { name, table, column } of tablesWithPatientId()) {
      const [{ n }] = await db.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(column, arthurId));
      counts.set(name, n);
    }
    const res = await call(exportData, `/api/patients/${arthurId}/export`, { cookie, params: { patientId: arthurId } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="caddis-patient-data-/);
    const data = await res.json();
    expect(data.format).toBe("caddis-patient-export/1");
    expect(data.tables.patients).toHaveLength(1);
    expect(data.tables.patients[0].healthRecordNumber).toBe("EM-100-001");
    for (const { name } of tablesWithPatientId()) {
      expect(data.tables[name], name).toHaveLength(counts.get(name)!);
      for (const row of data.tables[name]) expect(row.patientId, name).toBe(arthurId);
    }
    // Every table the seed or this test filled is there with rows.
    for (const name of ["care_team", "carer_links", "catheter_episodes", "episode_events", "passports", "check_ins", "diary_entries", "uploads", "outbound_messages", "visit_access"]) {
      expect(data.tables[name].length, name).toBeGreaterThan(0);
    }
    expect(data.tables.user[0].email).toBe("arthur.pell@eastmere.example");
    expect(data.tables.account.length).toBeGreaterThan(0);
    const text = JSON.stringify(data);
    expect(text).not.toContain(yusufId);
    expect(text).not.toContain("yusuf-row");
    expect(text).not.toContain("Haddad");
    expect(text).not.toMatch(/scrypt\$/);
    const [passport] = await db.select({ h: passports.tokenHash }).from(passports).where(eq(passports.patientId, arthurId));
    expect(text).not.toContain(passport.h);
    for (const key of ["password", "tokenHash", "shortCodeHash", "inviteTokenHash", "token", "ipHash", "secret", "backupCodes"]) {
      expect(text).not.toContain(`"${key}"`);
    }
    expect(data.omittedColumns).toEqual(expect.arrayContaining(["account.password", "passports.token_hash", "session.token", "audit_events.ip_hash"]));
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "patient.export"));
    expect(event).toMatchObject({ patientId: arthurId, via: "self" });
  });

  it("another patient gets 404; a carer, a clinician 403; anonymous 401", async () => {
    const path = `/api/patients/${arthurId}/export`;
    expect((await call(exportData, path, { cookie: await sessionFor("patientAr"), params: { patientId: arthurId } })).status).toBe(404);
    expect((await call(exportData, path, { cookie: await sessionFor("carer"), params: { patientId: arthurId } })).status).toBe(403);
    expect((await call(exportData, path, { cookie: await sessionFor("communityNurse"), params: { patientId: arthurId } })).status).toBe(403);
    expect((await call(exportData, path, { params: { patientId: arthurId } })).status).toBe(401);
  });

  it("an admin of the patient's organisation downloads it on the patient's request; an admin elsewhere gets 404", async () => {
    const res = await call(exportData, `/api/patients/${arthurId}/export?reason=Asked%20by%20the%20patient%20in%20writing`, {
      cookie: await sessionFor("admin"),
      params: { patientId: arthurId },
    });
    expect(res.status).toBe(200);
    const events = await db.select().from(auditEvents).where(eq(auditEvents.action, "patient.export"));
    expect(events.some((e) => e.via === "admin" && e.reason === "Asked by the patient in writing")).toBe(true);
    const elsewhere = await createOrganisation({ name: `Far Ward ${suffix()}` });
    const other = await createStaff({ role: "admin", organisationIds: [elsewhere.id] });
    const cookie = await signIn(other.email, other.password);
    expect((await call(exportData, `/api/patients/${arthurId}/export`, { cookie, params: { patientId: arthurId } })).status).toBe(404);
    expect((await call(closeRecord, `/api/admin/patients/${arthurId}/close`, { cookie, params: { patientId: arthurId }, body: { reason: "Moved away" } })).status).toBe(404);
    const list = await (await call(adminPatients, "/api/admin/patients", { cookie })).json();
    expect(list.patients).toEqual([]);
  });
});

async function newPatient(hrn: string) {
  const [p] = await db
    .insert(patients)
    .values({ givenName: "Testa", familyName: `Closewell ${suffix()}`, healthRecordNumber: hrn, dateOfBirth: "1950-01-01", sex: "female" })
    .returning({ id: patients.id });
  await db.insert(careTeam).values({ patientId: p.id, organisationId: orgs["Harbourside Community Nursing Team"] });
  await addRowsFor(p.id, hrn);
  return p.id;
}

describe("closing a record and retention", () => {
  it("closing makes the record read-only (409 record_closed), revokes its QR card and is audited", async () => {
    const admin = await sessionFor("admin");
    const id = await newPatient(`TT-${suffix()}`);
    const bad = await call(closeRecord, `/api/admin/patients/${id}/close`, { cookie: admin, params: { patientId: id }, body: { reason: "" } });
    expect(bad.status).toBe(400);
    expect((await db.select({ c: patients.closedAt }).from(patients).where(eq(patients.id, id)))[0].c).toBeNull();
    await db.transaction((tx) => assertRecordOpen(tx, id));

    const res = await call(closeRecord, `/api/admin/patients/${id}/close`, { cookie: admin, params: { patientId: id }, body: { reason: "Care ended: moved out of the area" } });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(new Date(body.removeAfter).getTime() - new Date(body.closedAt).getTime()).toBe(2920 * 86_400_000);
    await expect(db.transaction((tx) => assertRecordOpen(tx, id))).rejects.toMatchObject({ code: "record_closed", status: 409 });
    const again = await call(closeRecord, `/api/admin/patients/${id}/close`, { cookie: admin, params: { patientId: id }, body: { reason: "Twice" } });
    expect(again.status).toBe(409);
    expect((await again.json()).error.code).toBe("record_closed");
    const open = await db.select().from(passports).where(eq(passports.patientId, id));
    expect(open.every((p) => p.revokedAt !== null)).toBe(true);
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "patient.close"));
    expect(event).toMatchObject({ patientId: id, via: "admin", reason: "Care ended: moved out of the area" });
    // Clinicians and patients may not close records.
    for (const who of ["communityNurse", "patient"] as const) {
      expect((await call(closeRecord, `/api/admin/patients/${arthurId}/close`, { cookie: await sessionFor(who), params: { patientId: arthurId }, body: { reason: "No" } })).status).toBe(403);
    }
  });

  it("removes closed records past the retention period, keeps the rest, and logs each removal by HRN hash only", async () => {
    await db.update(settings).set({ value: 30 }).where(eq(settings.key, "retentionDays"));
    try {
      const oldHrn = `OLD-${suffix()}`;
      const old = await newPatient(oldHrn);
      const recent = await newPatient(`NEW-${suffix()}`);
      const [patientUser] = await db.insert(user).values({ id: randomUUID(), name: "Testa Closewell", email: `testa.${suffix()}@testwick.example`, role: "patient" }).returning({ id: user.id });
      await db.update(patients).set({ userId: patientUser.id, closedAt: new Date(Date.now() - 31 * 86_400_000) }).where(eq(patients.id, old));
      await db.update(patients).set({ closedAt: new Date(Date.now() - 10 * 86_400_000) }).where(eq(patients.id, recent));

      const result = await removeExpiredRecords({ log: () => {} });
      expect(result.removed).toBe(1);
      expect(result.objectKeys).toHaveLength(1);
      expect(await db.select().from(patients).where(eq(patients.id, old))).toHaveLength(0);
      expect(await db.select().from(user).where(eq(user.id, patientUser.id))).toHaveLength(0);
      for (const { name, table, column } of tablesWithPatientId()) {
        const [{ n }] = await db.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(column, old));
        expect(n, name).toBe(0);
      }
      expect(await db.select().from(patients).where(eq(patients.id, recent))).toHaveLength(1);
      const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "retention.remove"));
      expect(event.patientId).toBeNull();
      expect(event.via).toBe("system");
      expect(event.details).toMatchObject({ hrnHash: hashIdentifier("hrn", oldHrn), retentionDays: 30 });
      expect(JSON.stringify(event)).not.toContain(oldHrn);
      expect(JSON.stringify(event)).not.toContain(old);
      // Without a retention period nothing is removed.
      await db.delete(settings).where(eq(settings.key, "retentionDays"));
      await db.update(patients).set({ closedAt: new Date(Date.now() - 3650 * 86_400_000) }).where(eq(patients.id, recent));
      expect((await removeExpiredRecords({ log: () => {} })).removed).toBe(0);
    } finally {
      await db.insert(settings).values({ key: "retentionDays", value: 2920 }).onConflictDoUpdate({ target: settings.key, set: { value: 2920 } });
    }
  });
});
