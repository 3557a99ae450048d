// Issue 5's access matrix: every persona × (device card, full record, record a change, FHIR
// export), each cell asserted, on Arthur Pell's record (care team Harbourside, carer Joan Pell).
// The other clinician (Rowan Ward) is asserted before and after stating a reason through the
// passport. ASVS 8.2.1 function level, 8.2.2 data level, 8.3.1 on the server, 8.4.1 tenants.
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postChange } from "@/app/api/patients/[patientId]/episodes/change/route";
import { GET as getFhir } from "@/app/api/patients/[patientId]/fhir/route";
import { GET as getPatient } from "@/app/api/patients/[patientId]/route";
import { POST as postVisit } from "@/app/api/patients/[patientId]/visits/route";
import { POST as visitAccessPost } from "@/app/api/visit-access/route";
import { getViewerFromHeaders, type Viewer } from "@/lib/auth/session";
import { issuePassport } from "@/lib/passport";
import { openDeviceCard } from "@/lib/qr/device-card";
import { demoDevice, patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

type Persona = "anonymous" | "careTeamClinician" | "otherBefore" | "otherAfter" | "patient" | "carer" | "admin";
type Row = { card: "ok"; record: number; change: number; visit: number; fhir: number };

// What each persona must get. "record a change" sends a complete, valid change; "record a visit"
// a visit with NEWS2. 201 = written; 401/403/404 = refused with nothing written.
const expected: Record<Persona, Row> = {
  anonymous: { card: "ok", record: 401, change: 401, visit: 401, fhir: 401 },
  careTeamClinician: { card: "ok", record: 200, change: 201, visit: 201, fhir: 200 },
  otherBefore: { card: "ok", record: 404, change: 404, visit: 404, fhir: 404 },
  otherAfter: { card: "ok", record: 200, change: 201, visit: 201, fhir: 200 },
  patient: { card: "ok", record: 403, change: 403, visit: 403, fhir: 403 },
  carer: { card: "ok", record: 403, change: 403, visit: 403, fhir: 403 },
  admin: { card: "ok", record: 403, change: 403, visit: 403, fhir: 403 },
};

const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();
let step = 60;

/** A complete planned change to an all-silicone catheter (Arthur Pell is latex-allergic). */
function changeBody() {
  step -= 5;
  return {
    ...demoDevice,
    lot: "QR12",
    // Source: clinical-checks.md §7, worked element string (expiry 2028-11-30, valid check digit).
    expiry: "2028-11-30",
    gtin: "09506000134352",
    indication: "Chronic urinary retention",
    insertedAt: minutesAgo(step),
    gelKind: "plain",
    gelVolumeMl: 11,
    attempts: 1,
    maxDwellDays: 84,
    reviewIntervalDays: 28,
    overrides: [],
    changeKind: "planned",
    needReviewed: true,
  };
}

// Source: RCP NEWS2 (2017) chart 1: RR 22 → 2, SpO2 95 (scale 1) → 1, air → 0, SBP 105 → 1,
// pulse 95 → 1, alert → 0, 38.3 °C → 1; total 6 (medium).
const visitBody = () => ({
  occurredAt: minutesAgo(1),
  notes: "Visit from the passport",
  observations: { respirationRate: 22, spo2: 95, spo2Scale: 1, onOxygen: false, systolicBp: 105, pulse: 95, consciousness: "A", temperatureC: 38.3 },
});

let arthur: string;
let token: string;
const cookies: Partial<Record<Persona, string | undefined>> = {};
const viewers: Partial<Record<Persona, Viewer | null>> = {};

async function cells(who: Persona) {
  const cookie = cookies[who];
  const params = { patientId: arthur };
  const card = await openDeviceCard({ credential: token, request: { headers: new Headers({ [CLIENT_ADDRESS_HEADER]: `10.60.0.${who.length}` }) }, viewer: viewers[who] ?? null });
  const record = await call(getPatient, `/api/patients/${arthur}`, { cookie, params });
  const change = await call(postChange, `/api/patients/${arthur}/episodes/change`, { cookie, params, body: changeBody() });
  const visit = await call(postVisit, `/api/patients/${arthur}/visits`, { cookie, params, body: visitBody() });
  const fhir = await call(getFhir, `/api/patients/${arthur}/fhir`, { cookie, params });
  return { card: card.kind, record: record.status, change: change.status, visit: visit.status, fhir: fhir.status };
}

beforeAll(async () => {
  arthur = await patientIdByHrn("EM-100-001");
  cookies.anonymous = undefined;
  cookies.careTeamClinician = await sessionFor("communityNurse");
  cookies.otherBefore = await sessionFor("rowanNurse");
  cookies.otherAfter = cookies.otherBefore;
  cookies.patient = await sessionFor("patient");
  cookies.carer = await sessionFor("carer");
  cookies.admin = await sessionFor("admin");
  for (const p of Object.keys(cookies) as Persona[]) {
    viewers[p] = cookies[p] ? await getViewerFromHeaders(new Headers({ cookie: cookies[p]! })) : null;
  }
  const issued = await issuePassport({ viewer: viewers.careTeamClinician!, patientId: arthur });
  token = issued.url.split("/p/")[1]!;
}, 60_000);

describe("issue 5 access matrix", () => {
  // Order matters: the other clinician is asserted before the reason is given, then after.
  for (const who of ["anonymous", "careTeamClinician", "otherBefore", "patient", "carer", "admin"] as const) {
    it(`${who}: device card, full record, record a change, record a visit, FHIR export`, async () => {
      expect(await cells(who)).toEqual(expected[who]);
    });
  }

  it("otherAfter: the same clinician after stating a reason through the passport", async () => {
    const grant = await call(visitAccessPost, "/api/visit-access", { cookie: cookies.otherAfter, body: { token, reason: "Out-of-hours visit: catheter bypassing" } });
    expect(grant.status).toBe(201);
    expect(await cells("otherAfter")).toEqual(expected.otherAfter);
  });
});
