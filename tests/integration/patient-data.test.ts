// A patient's own data: the JSON export holds every table's rows for that patient (tables found
// from the schema, so a new table is covered) and nothing of any other patient, no secrets;
// closing a record makes it read-only; the retention job removes it after the period and logs it.
import { randomBytes, randomUUID } from "node:crypto";
import { eq, inArray, sql } from "drizzle-orm";
import { Fhir } from "fhir";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as exportData } from "@/app/api/patients/[patientId]/export/route";
import { POST as closeRecord } from "@/app/api/admin/patients/[patientId]/close/route";
import { PATCH as patchPatient } from "@/app/api/patients/[patientId]/route";
import { GET as adminPatients } from "@/app/api/admin/patients/route";
import { db } from "@/db";
import { tablesWithPatientId } from "@/db/queries/patient-export";
import {
  auditEvents,
  bagChanges,
  careTeam,
  carerLinks,
  caseloadItems,
  checkIns,
  diaryEntries,
  dischargeChecklists,
  observations,
  organisations,
  outboundMessages,
  passports,
  patientInvites,
  patients,
  referrals,
  settings,
  supplyRequests,
  uploads,
  user,
  visitAccess,
} from "@/db/schema";
import { audit } from "@/lib/records/audit";
import { hashIdentifier, hashToken } from "@/lib/admin/tokens";
import { QUEUES } from "@/lib/jobs/boss";
import { removeExpiredRecords } from "@/lib/jobs/retention";
import { startBackground } from "@/lib/jobs/runtime";
import { headObject, putObject } from "@/lib/storage";
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
  // A one-time secret in a body not yet sent: the export must not carry it.
  await db.insert(outboundMessages).values({
    idempotencyKey: `${tag}-secret-${randomUUID()}`,
    messageId: `<${randomUUID()}@caddis.invalid>`,
    kind: "carer-invite",
    toAddress: "carer@mail-test.example",
    subject: `${tag} invite`,
    html: `one-time-${tag}`,
    text: `one-time-${tag}`,
    redactAfterSend: true,
    patientId,
  });
  await db.insert(visitAccess).values({ patientId, userId: nurse, reason: tag, expiresAt: new Date(Date.now() + 3600_000) });
  await db.insert(bagChanges).values({ patientId, kind: "leg-bag", changedOn: "2026-11-30", recordedByUserId: nurse });
  await db.insert(patientInvites).values({ patientId, codeHash: hashToken(randomUUID()), expiresAt: new Date(Date.now() + 86_400_000), usedAt: new Date() });
  await db.insert(supplyRequests).values({ patientId, periodDays: 28, items: [{ item: "leg-bag", computed: 4, quantity: 4, intervalDays: 7 }], requestedByName: tag });
  const orgId = async (name: string) => (await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, name)))[0].id;
  const [referral] = await db
    .insert(referrals)
    .values({ patientId, fromOrganisationId: await orgId("Larch Ward"), toOrganisationId: await orgId("Rowan Ward"), handoverNote: tag, referrerStays: true })
    .returning({ id: referrals.id });
  await db.insert(dischargeChecklists).values({ patientId, referralId: referral.id, recordedByName: tag, taught: ["drinks"], suppliesGiven: false, portalActivationGiven: false });
  await db.insert(observations).values({
    patientId,
    takenAt: new Date(),
    respirationRate: 16,
    spo2: 97,
    spo2Scale: 1,
    onOxygen: false,
    systolicBp: 128,
    pulse: 72,
    consciousness: "A",
    temperatureC: 36.8,
    news2Total: 0,
    news2Subscores: {},
    news2Risk: "low",
    news2Response: "routine",
    recordedByUserId: nurse,
    recordedByName: tag,
  });
  await db.insert(caseloadItems).values({ patientId, kind: "sample-result", summary: `Sample ${tag}`, reporter: { kind: "clinician", name: tag, organisation: null, phone: null } });
  await audit({ action: "patient.view", actor: { userId: nurse, role: "clinician" }, patientId, via: "care_team", details: { tag } });
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
  it("finds every table with a patient_id column in the schema, and the database has no other table that holds a patient's rows", async () => {
    const names = tablesWithPatientId().map((t) => t.name);
    expect(names).toEqual(
      expect.arrayContaining([
        "audit_events", "bag_changes", "care_team", "carer_links", "catheter_episodes", "check_ins", "diary_entries", "episode_events",
        "observations", "outbound_messages", "passports", "patient_invites", "supply_requests", "uploads", "visit_access",
      ]),
    );
    // Read from the database itself, not the schema module: every table with a patient_id column…
    const withColumn = await db.execute<{ table_name: string }>(
      sql`select table_name from information_schema.columns where table_schema = 'public' and column_name = 'patient_id' order by table_name`,
    );
    expect(withColumn.rows.map((r) => r.table_name).sort()).toEqual([...names].sort());
    // …every foreign key to patients is a patient_id column, and every table that points at a
    // patient-linked table carries a patient_id of its own, so no row of a patient hides one step away.
    const fks = await db.execute<{ child: string; column: string; parent: string }>(sql`
      select tc.table_name as child, kcu.column_name as column, ccu.table_name as parent
        from information_schema.table_constraints tc
        join information_schema.key_column_usage kcu on kcu.constraint_name = tc.constraint_name and kcu.table_schema = tc.table_schema
        join information_schema.constraint_column_usage ccu on ccu.constraint_name = tc.constraint_name and ccu.table_schema = tc.table_schema
       where tc.constraint_type = 'FOREIGN KEY' and tc.table_schema = 'public'`);
    const linked = new Set(["patients", ...names]);
    for (const fk of fks.rows) {
      if (fk.parent === "patients") expect(fk.column, `${fk.child}.${fk.column}`).toBe("patient_id");
      if (linked.has(fk.parent) && fk.child !== fk.parent) expect(names, `${fk.child} → ${fk.parent}`).toContain(fk.child);
    }
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
    // Every patient-linked table has rows for Arthur (from the seed or addRowsFor), so each one is
    // proved to be exported: a new table fails here until it is given a row above.
    for (const { name } of tablesWithPatientId()) expect(data.tables[name].length, name).toBeGreaterThan(0);
    // A one-time secret in an unsent body stays out; the message itself is listed.
    expect(JSON.stringify(data)).not.toContain("one-time-arthur-row");
    expect(data.tables.outbound_messages.some((m: { subject: string; html: string }) => m.subject === "arthur-row invite" && m.html === "")).toBe(true);
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

  it("gives the patient their record as a FHIR R4 Bundle too (valid, theirs only), audited as such", async () => {
    const cookie = await sessionFor("patient");
    const res = await call(exportData, `/api/patients/${arthurId}/export?format=fhir`, { cookie, params: { patientId: arthurId } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^application\/fhir\+json/);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="caddis-patient-record-\d{4}-\d{2}-\d{2}\.fhir\.json"/);
    expect(res.headers.get("cache-control")).toContain("no-store");
    const bundle = await res.json();
    const result = new Fhir().validate(bundle, { errorOnUnexpected: true });
    expect((result.messages ?? []).filter((m) => m.severity === "error")).toEqual([]);
    expect(bundle).toMatchObject({ resourceType: "Bundle", type: "collection" });
    const resources = bundle.entry.map((e: { resource: { resourceType: string } }) => e.resource);
    const patient = resources.find((r: { resourceType: string }) => r.resourceType === "Patient");
    expect(patient.identifier).toEqual(expect.arrayContaining([expect.objectContaining({ value: "EM-100-001" })]));
    expect(resources.some((r: { resourceType: string }) => r.resourceType === "Device")).toBe(true);
    const text = JSON.stringify(bundle);
    expect(text).not.toContain(yusufId);
    expect(text).not.toContain("Haddad");
    const events = await db.select().from(auditEvents).where(eq(auditEvents.action, "patient.export"));
    expect(events.some((e) => e.patientId === arthurId && e.via === "self" && (e.details as { format?: string }).format === "fhir-r4")).toBe(true);
    // An admin on the patient's request gets the same Bundle; an unknown format is refused.
    const admin = await sessionFor("admin");
    const byAdmin = await call(exportData, `/api/patients/${arthurId}/export?format=fhir&reason=Asked%20for%20FHIR%20by%20letter`, { cookie: admin, params: { patientId: arthurId } });
    expect(byAdmin.status).toBe(200);
    expect((await byAdmin.json()).resourceType).toBe("Bundle");
    const bad = await call(exportData, `/api/patients/${arthurId}/export?format=xml`, { cookie, params: { patientId: arthurId } });
    expect(bad.status).toBe(400);
    // Carers and clinicians cannot use the patient's own download in either format.
    expect((await call(exportData, `/api/patients/${arthurId}/export?format=fhir`, { cookie: await sessionFor("carer"), params: { patientId: arthurId } })).status).toBe(403);
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
    const nurse = await sessionFor("communityNurse");
    const edit = (familyName: string) =>
      call(patchPatient, `/api/patients/${id}`, { method: "PATCH", cookie: nurse, params: { patientId: id }, body: { familyName } });
    expect((await edit("Closewell-Open")).status).toBe(200);

    const res = await call(closeRecord, `/api/admin/patients/${id}/close`, { cookie: admin, params: { patientId: id }, body: { reason: "Care ended: moved out of the area" } });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(new Date(body.removeAfter).getTime() - new Date(body.closedAt).getTime()).toBe(2920 * 86_400_000);
    // Read-only through the app: every write route is tried in closed-record.test.ts; here one edit.
    const refused = await edit("Closewell-Closed");
    expect(refused.status).toBe(409);
    expect((await refused.json()).error.code).toBe("record_closed");
    expect((await db.select({ f: patients.familyName }).from(patients).where(eq(patients.id, id)))[0].f).toBe("Closewell-Open");
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
      // Stored files: an upload and a booklet of the old record, one upload of the recent one.
      const oldFiles = [`patients/${old}/${randomUUID()}`, `passports/${old}/${randomUUID()}.pdf`];
      const keptFile = `patients/${recent}/${randomUUID()}`;
      for (const key of [...oldFiles, keptFile]) await putObject({ key, body: new Uint8Array([37, 80, 68, 70]), contentType: "application/pdf" });
      // Carers: one looks after only the old record, one after both.
      const carer = async (name: string) =>
        (await db.insert(user).values({ id: randomUUID(), name, email: `${name.toLowerCase().replace(" ", ".")}.${suffix()}@testwick.example`, role: "carer" }).returning({ id: user.id }))[0].id;
      const onlyOld = await carer("Carer Onlyold");
      const both = await carer("Carer Both");
      await db.insert(carerLinks).values([
        { patientId: old, carerUserId: onlyOld, invitedEmail: "a@testwick.example", status: "active" },
        { patientId: old, carerUserId: both, invitedEmail: "b@testwick.example", status: "active" },
        { patientId: recent, carerUserId: both, invitedEmail: "b@testwick.example", status: "revoked" },
      ]);

      const accessLog = await db.select({ id: auditEvents.id }).from(auditEvents).where(eq(auditEvents.patientId, old));
      expect(accessLog.length).toBeGreaterThan(0);
      const lines: string[] = [];
      const result = await removeExpiredRecords({ log: (m) => lines.push(m) });
      expect(result.removed).toBe(1);
      // The record's access log goes with the record (not merely unlinked from it).
      expect(await db.select().from(auditEvents).where(inArray(auditEvents.id, accessLog.map((a) => a.id)))).toHaveLength(0);
      expect(result.objectKeys).toHaveLength(1);
      expect(await db.select().from(patients).where(eq(patients.id, old))).toHaveLength(0);
      expect(await db.select().from(user).where(eq(user.id, patientUser.id))).toHaveLength(0);
      for (const { name, table, column } of tablesWithPatientId()) {
        const [{ n }] = await db.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(column, old));
        expect(n, name).toBe(0);
      }
      expect(await db.select().from(patients).where(eq(patients.id, recent))).toHaveLength(1);
      // The files go from the object store; the other record's stay.
      for (const key of oldFiles) expect(await headObject({ key }), key).toBeNull();
      expect(await headObject({ key: keptFile })).not.toBeNull();
      expect(result.objectsDeleted).toBeGreaterThanOrEqual(oldFiles.length);
      // A carer who looked after nobody else goes; one who is linked to another record stays.
      expect(await db.select().from(user).where(eq(user.id, onlyOld))).toHaveLength(0);
      expect(await db.select().from(user).where(eq(user.id, both))).toHaveLength(1);
      const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "retention.remove"));
      expect(event.patientId).toBeNull();
      expect(event.via).toBe("system");
      expect(event.details).toMatchObject({ hrnHash: hashIdentifier("hrn", oldHrn), retentionDays: 30, rows: { carer_accounts: 1 } });
      expect((event.details as { storedFiles: number }).storedFiles).toBeGreaterThanOrEqual(oldFiles.length);
      // It says what it removed, table by table, in the audit log and in the job's log.
      const rows = (event.details as { rows: Record<string, number> }).rows;
      for (const name of ["patients", "user", "check_ins", "diary_entries", "bag_changes", "patient_invites", "supply_requests", "outbound_messages", "uploads", "passports", "visit_access", "audit_events", "care_team"]) {
        expect(rows[name], name).toBeGreaterThan(0);
      }
      expect(lines.join("\n")).toMatch(/removed the record [0-9a-f]{12}… closed \d{4}-\d{2}-\d{2}: .*check_ins 1/);
      expect(lines.join("\n")).toMatch(/removed 1 closed record\(s\) past 30 days/);
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

  it("keeps a due record whole when the object store is away, and removes it on the next run", async () => {
    await db.update(settings).set({ value: 30 }).where(eq(settings.key, "retentionDays"));
    const cache = globalThis as unknown as { caddisS3?: unknown };
    const working = cache.caddisS3;
    try {
      const due = await newPatient(`DOWN-${suffix()}`);
      await db.update(patients).set({ closedAt: new Date(Date.now() - 40 * 86_400_000) }).where(eq(patients.id, due));
      const file = `patients/${due}/${randomUUID()}`;
      await putObject({ key: file, body: new Uint8Array([37, 80, 68, 70]), contentType: "application/pdf" });
      const { S3Client } = await import("@aws-sdk/client-s3");
      // Nothing listens on port 9 (discard) here: every call to the store fails.
      cache.caddisS3 = new S3Client({ endpoint: "http://127.0.0.1:9", region: "us-east-1", forcePathStyle: true, credentials: { accessKeyId: "x", secretAccessKey: "x" }, maxAttempts: 1 });
      const lines: string[] = [];
      const down = await removeExpiredRecords({ log: (m) => lines.push(m) });
      // (Other closed records of this file may be due too: they fail alike.)
      expect(down.removed).toBe(0);
      expect(down.failed).toBeGreaterThanOrEqual(1);
      expect(lines.join("\n")).toMatch(/could not remove a record due for removal \(kept whole/);
      expect(await db.select().from(patients).where(eq(patients.id, due))).toHaveLength(1);
      expect((await db.select().from(checkIns).where(eq(checkIns.patientId, due))).length).toBeGreaterThan(0);
      cache.caddisS3 = working;
      expect(await headObject({ key: file })).not.toBeNull();
      const up = await removeExpiredRecords({ log: () => {} });
      expect(up.failed).toBe(0);
      expect(up.removed).toBeGreaterThanOrEqual(1);
      expect(await db.select().from(patients).where(eq(patients.id, due))).toHaveLength(0);
      expect(await headObject({ key: file })).toBeNull();
    } finally {
      cache.caddisS3 = working;
      await db.insert(settings).values({ key: "retentionDays", value: 2920 }).onConflictDoUpdate({ target: settings.key, set: { value: 2920 } });
    }
  });

  it("is scheduled daily with pg-boss in the deployment's time zone, and the scheduled job removes what is due", { timeout: 60_000 }, async () => {
    await db.update(settings).set({ value: 30 }).where(eq(settings.key, "retentionDays"));
    const bg = await startBackground({ outbox: false, schedules: true, worker: { log: () => {} } });
    try {
      expect(bg.boss).toBeTruthy();
      const schedules = (await bg.boss!.getSchedules()).filter((s) => s.name === QUEUES.retention);
      expect(schedules).toHaveLength(1);
      expect(schedules[0]).toMatchObject({ cron: "30 2 * * *", timezone: "Europe/London" });
      const due = await newPatient(`DUE-${suffix()}`);
      await db.update(patients).set({ closedAt: new Date(Date.now() - 40 * 86_400_000) }).where(eq(patients.id, due));
      // Run the job now rather than wait for the night.
      await bg.boss!.send(QUEUES.retention, {});
      let gone = false;
      for (let i = 0; i < 150 && !gone; i++) {
        await new Promise((r) => setTimeout(r, 200));
        gone = (await db.select().from(patients).where(eq(patients.id, due))).length === 0;
      }
      expect(gone).toBe(true);
      expect((await db.select().from(auditEvents).where(eq(auditEvents.action, "retention.remove"))).length).toBeGreaterThan(0);
    } finally {
      await bg.stop();
      await db.insert(settings).values({ key: "retentionDays", value: 2920 }).onConflictDoUpdate({ target: settings.key, set: { value: 2920 } });
    }
  });
});
