// Audit search for admins: who opened or changed which patient's record, when and how, for an
// admin of the patient's organisations (and for events by their own staff) only; CSV export
// with formula-injection-safe cells.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as auditSearch } from "@/app/api/admin/audit/route";
import { GET as auditExport } from "@/app/api/admin/audit/export/route";
import { db } from "@/db";
import { auditEvents, patients, visitAccess } from "@/db/schema";
import { audit } from "@/lib/records/audit";
import { getViewerFromHeaders } from "@/lib/auth/session";
import { openPatientRecord } from "@/lib/records/patient-record";
import { call, sessionFor, signIn } from "../support/http";
import { createOrganisation, createStaff, suffix } from "../support/staff";

let admin: string;
let otherAdmin: string;
let arthurId: string;
let outsiderName: string;
let otherAdminName: string;

async function viewerOf(cookie: string) {
  const v = await getViewerFromHeaders(new Headers({ cookie }));
  if (!v) throw new Error("no viewer");
  return v;
}

beforeAll(async () => {
  admin = await sessionFor("admin");
  [{ id: arthurId }] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  // Grace (care team) opens Arthur's record; Priya (Rowan Ward, another team) through visit access.
  const grace = await viewerOf(await sessionFor("communityNurse"));
  await openPatientRecord({ viewer: grace, patientId: arthurId, action: "patient.view.device", request: { headers: new Headers() } });
  const priya = await viewerOf(await sessionFor("rowanNurse"));
  await db.insert(visitAccess).values({ patientId: arthurId, userId: priya.userId, reason: "Out-of-hours visit", expiresAt: new Date(Date.now() + 3600_000) });
  await openPatientRecord({ viewer: priya, patientId: arthurId, action: "patient.view.history", reason: "Out-of-hours visit" });
  // A clinician of an organisation Morgan has nothing to do with, also visiting Arthur, with a reason
  // that a spreadsheet would run as a formula.
  const elsewhere = await createOrganisation({ name: `Outlying Team ${suffix()}`, kind: "community_team" });
  const outsider = await createStaff({ role: "clinician", organisationIds: [elsewhere.id], name: `Olu Outlying ${suffix()}` });
  outsiderName = outsider.name;
  const outsiderViewer = await viewerOf(await signIn(outsider.email, outsider.password));
  await db.insert(visitAccess).values({ patientId: arthurId, userId: outsider.id, reason: "=HYPERLINK(\"http://x.invalid\")", expiresAt: new Date(Date.now() + 3600_000) });
  await openPatientRecord({ viewer: outsiderViewer, patientId: arthurId, action: "patient.view.device", reason: "=HYPERLINK(\"http://x.invalid\")" });
  // An event elsewhere that Morgan must not see: by the outsider, about no patient of Morgan's.
  await audit({ action: "patient.view.device", actor: outsiderViewer, organisationId: elsewhere.id, via: "care_team", details: { note: "elsewhere only" } });
  const other = await createStaff({ role: "admin", organisationIds: [elsewhere.id] });
  otherAdminName = other.name;
  otherAdmin = await signIn(other.email, other.password);
});

type Ev = { action: string; via: string; reason: string | null; actor: { name: string } | null; patient: { healthRecordNumber: string } | null; details: Record<string, unknown> };
async function search(cookie: string, query: string) {
  const res = await call(auditSearch, `/api/admin/audit?${query}`, { cookie });
  expect(res.status).toBe(200);
  return (await res.json()) as { events: Ev[]; total: number; page: number; pages: number };
}

describe("audit search", () => {
  it("finds who opened Arthur's record and how: care team, visit access", async () => {
    const r = await search(admin, "patient=EM-100-001&action=patient.view");
    const seen = r.events.map((e) => `${e.actor?.name}|${e.via}|${e.action}`);
    expect(seen).toEqual(
      expect.arrayContaining([
        "Grace Mensah|care_team|patient.view.device",
        "Priya Sandhu|visit_access|patient.view.history",
        `${outsiderName}|visit_access|patient.view.device`,
      ]),
    );
    expect(r.events.every((e) => e.patient?.healthRecordNumber === "EM-100-001")).toBe(true);
  });

  it("filters by person, patient name, via and date range, and pages", async () => {
    expect((await search(admin, "person=Grace&patient=Pell")).events.every((e) => e.actor?.name === "Grace Mensah")).toBe(true);
    expect((await search(admin, "via=visit_access&patient=pell")).events.every((e) => e.via === "visit_access")).toBe(true);
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    expect((await search(admin, `from=${tomorrow}`)).total).toBe(0);
    const today = new Date().toISOString().slice(0, 10);
    const all = await search(admin, `from=${today}&to=${today}&patient=EM-100-001`);
    expect(all.total).toBeGreaterThanOrEqual(3);
    const p2 = await search(admin, `from=${today}&to=${today}&patient=EM-100-001&pageSize=1&page=2`);
    expect(p2.events).toHaveLength(1);
    expect(p2.pages).toBe(all.total);
    const bad = await call(auditSearch, "/api/admin/audit?from=yesterday&to=2026-01-01&via=phone", { cookie: admin });
    expect(bad.status).toBe(400);
  });

  it("an admin of another organisation sees events by their own staff, and nothing else of Morgan's patients", async () => {
    const r = await search(otherAdmin, "");
    expect(r.events.length).toBeGreaterThan(0);
    // Their own staff: the outsider, and the admin's own sign-in (account.sign_in).
    expect(r.events.every((e) => e.actor?.name === outsiderName || e.actor?.name === otherAdminName)).toBe(true);
    expect(r.events.some((e) => e.actor?.name === outsiderName)).toBe(true);
    // Morgan, for his part, does not see the outsider's event about no patient of his.
    const m = await search(admin, `person=${encodeURIComponent(outsiderName)}`);
    expect(m.events.some((e) => e.details.note === "elsewhere only")).toBe(false);
    expect(m.events.length).toBeGreaterThan(0);
  });

  it("clinicians, patients and carers get 403", async () => {
    for (const who of ["communityNurse", "patient", "carer"] as const) {
      const cookie = await sessionFor(who);
      expect((await call(auditSearch, "/api/admin/audit", { cookie })).status).toBe(403);
      expect((await call(auditExport, "/api/admin/audit/export", { cookie })).status).toBe(403);
    }
  });
});

describe("audit CSV export", () => {
  it("exports the search as CSV with formula cells defused, and records the export", async () => {
    const res = await call(auditExport, "/api/admin/audit/export?patient=EM-100-001", { cookie: admin });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="caddis-audit-\d{4}-\d{2}-\d{2}\.csv"$/);
    const text = await res.text();
    const lines = text.replace(/^\uFEFF/, "").trim().split("\r\n");
    expect(lines[0]).toBe("time_utc,action,via,reason,actor_name,actor_email,actor_role,patient_name,health_record_number,organisation,details");
    expect(lines.length).toBeGreaterThanOrEqual(4);
    expect(text).toContain(`"'=HYPERLINK(""http://x.invalid"")"`);
    expect(lines.slice(1).some((l) => /(^|,)[=+\-@]/.test(l.replace(/"[^"]*"/g, "")))).toBe(false);
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "admin.audit.export"));
    expect(event.details).toMatchObject({ filters: { patient: "EM-100-001" } });
  });
});
