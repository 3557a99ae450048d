// FHIR R4 export: a Bundle with Patient, Device (udiCarrier, lotNumber, expirationDate,
// manufacturer, type), DeviceUseStatement and NEWS2 Observations, validated by the general-purpose
// `fhir` package (core R4 structure definitions and value sets); audited; staff with access only
// (the full matrix is in visit-access-matrix.test.ts and security/access-matrix.ts).
import { eq } from "drizzle-orm";
import { Fhir } from "fhir";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postChange } from "@/app/api/patients/[patientId]/episodes/change/route";
import { GET as getFhir } from "@/app/api/patients/[patientId]/fhir/route";
import { POST as postVisit } from "@/app/api/patients/[patientId]/visits/route";
import { db } from "@/db";
import { auditEvents } from "@/db/schema";
import { buildFhirBundle } from "@/lib/fhir/export";
import { env } from "@/lib/config/env";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";

type Resource = { resourceType: string; [k: string]: unknown };
type Bundle = { resourceType: string; type: string; entry: { fullUrl: string; resource: Resource }[] };

let arthur: string;
let nurse: string;
let bundle: Bundle;
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString();
const errorsOf = (r: { messages?: { severity?: string; location?: string; message?: string }[] }) => (r.messages ?? []).filter((m) => m.severity === "error");

beforeAll(async () => {
  arthur = await patientIdByHrn("EM-100-001");
  nurse = await sessionFor("communityNurse");
  const params = { patientId: arthur };
  // A change with a scanned label (so the old catheter is completed, the new one active), and a visit with NEWS2.
  const change = await call(postChange, `/api/patients/${arthur}/episodes/change`, {
    cookie: nurse,
    params,
    body: {
      route: "urethral", catheterType: "two-way", material: "all-silicone", lengthCategory: "standard", sizeCh: 14, balloonMl: 10,
      maker: "Northfen Medical (demo)", productName: "Silicone two-way 14 Ch (demo)", lot: "AB12",
      // Source: GS1 General Specifications, AIs (01) GTIN, (17) expiry, (10) lot, (21) serial and the check digit of section 7.9.1 (GTIN 09506000134352, expiry 2028-11-30, lot AB12, serial XYZ).
      expiry: "2028-11-30", gtin: "09506000134352", serial: "XYZ", udi: "010950600013435217281100" + "10AB12\u001d21XYZ",
      indication: "Chronic urinary retention", insertedAt: minutesAgo(40), gelKind: "plain", gelVolumeMl: 11, attempts: 1,
      maxDwellDays: 84, reviewIntervalDays: 28, overrides: [], changeKind: "planned", needReviewed: true,
    },
  });
  expect(change.status).toBe(201);
  // Source: RCP NEWS2 (2017) chart 1: RR 22 → 2, SpO2 95 → 1, SBP 105 → 1, pulse 95 → 1, 38.3 °C → 1; total 6.
  const visit = await call(postVisit, `/api/patients/${arthur}/visits`, {
    cookie: nurse,
    params,
    body: { occurredAt: minutesAgo(10), observations: { respirationRate: 22, spo2: 95, spo2Scale: 1, onOxygen: false, systolicBp: 105, pulse: 95, consciousness: "A", temperatureC: 38.3 } },
  });
  expect(visit.status).toBe(201);
  const res = await call(getFhir, `/api/patients/${arthur}/fhir`, { cookie: nurse, params });
  expect(res.status).toBe(200);
  expect(res.headers.get("content-type")).toContain("application/fhir+json");
  expect(res.headers.get("cache-control")).toBe("no-store");
  bundle = await res.json();
}, 60_000);

describe("GET /api/patients/[patientId]/fhir", () => {
  it("is valid FHIR R4 according to the fhir package, with no errors", () => {
    const result = new Fhir().validate(bundle, { errorOnUnexpected: true });
    expect(errorsOf(result)).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it("holds the Patient, a Device and a DeviceUseStatement per catheter, and the NEWS2 Observation", () => {
    expect(bundle).toMatchObject({ resourceType: "Bundle", type: "collection" });
    const of = (t: string) => bundle.entry.map((e) => e.resource).filter((r) => r.resourceType === t);
    const [patient] = of("Patient");
    expect(patient).toMatchObject({ gender: "male", identifier: [{ value: "EM-100-001" }] });
    const devices = of("Device");
    const statements = of("DeviceUseStatement");
    expect(devices.length).toBeGreaterThanOrEqual(2);
    expect(statements.length).toBe(devices.length);
    const active = devices.find((d) => d.status === "active")!;
    expect(active).toMatchObject({
      udiCarrier: [{ deviceIdentifier: "09506000134352", carrierHRF: expect.stringContaining("0109506000134352") }],
      lotNumber: "AB12",
      expirationDate: "2028-11-30",
      manufacturer: "Northfen Medical (demo)",
      serialNumber: "XYZ",
      // Source: HL7 FHIR R4, value set device-kind: SNOMED CT 23973005 "Indwelling urinary catheter, device".
      type: { coding: [{ system: "http://snomed.info/sct", code: "23973005" }] },
    });
    expect(devices.filter((d) => d.status === "inactive").length).toBe(devices.length - 1);
    expect(statements.map((s) => s.status).sort()).toEqual([...Array(devices.length - 1).fill("completed"), "active"].sort());
    const fullUrls = new Set(bundle.entry.map((e) => e.fullUrl));
    for (const s of statements) {
      expect(fullUrls.has((s.device as { reference: string }).reference)).toBe(true);
      expect(fullUrls.has((s.subject as { reference: string }).reference)).toBe(true);
    }
    const [news2] = of("Observation");
    // Source: UK edition of SNOMED CT, 1104051000000101 (NEWS2 total score), as NHS England's UK Core FHIR guide uses it.
    expect(news2).toMatchObject({ status: "final", valueInteger: 6, code: { coding: [{ code: "1104051000000101" }] } });
    expect((news2.component as unknown[]).length).toBe(7);
  });

  it("carries each vital sign with its LOINC code and UCUM unit, the visit as an Encounter, the CareTeam with its lead team, Ch in [Ch], and the configured identifier system", () => {
    const of = (t: string) => bundle.entry.map((e) => e.resource).filter((r) => r.resourceType === t);
    const [patient] = of("Patient");
    // A namespace URI from configuration (FHIR_HRN_SYSTEM), not the app's own address.
    expect((patient!.identifier as { system: string }[])[0]!.system).toBe(env.FHIR_HRN_SYSTEM);
    expect((patient!.identifier as { system: string }[])[0]!.system).not.toContain(new URL(env.APP_URL).host);
    const observations = of("Observation");
    const news2 = observations.find((o) => (o.code as { coding: { code: string }[] }).coding[0]!.code === "1104051000000101")!;
    const byLoinc = (code: string) => observations.find((o) => (o.code as { coding: { system: string; code: string }[] }).coding[0]!.code === code && (o.code as { coding: { system: string }[] }).coding[0]!.system === "http://loinc.org");
    // Source: LOINC 9279-1, 59408-5, 8480-6, 8867-4, 8310-5 (HL7 FHIR R4 vital signs); UCUM /min, %, mm[Hg], Cel.
    // Values as posted above: RR 22, SpO2 95, SBP 105, pulse 95, 38.3 °C.
    expect(byLoinc("9279-1")).toMatchObject({ valueQuantity: { value: 22, system: "http://unitsofmeasure.org", code: "/min" } });
    expect(byLoinc("59408-5")).toMatchObject({ valueQuantity: { value: 95, code: "%" } });
    expect(byLoinc("8480-6")).toMatchObject({ valueQuantity: { value: 105, code: "mm[Hg]" } });
    expect(byLoinc("8867-4")).toMatchObject({ valueQuantity: { value: 95, code: "/min" } });
    expect(byLoinc("8310-5")).toMatchObject({ valueQuantity: { value: 38.3, code: "Cel" } });
    expect(byLoinc("67775-7")).toMatchObject({ valueCodeableConcept: { text: "A" } });
    const fullUrls = new Set(bundle.entry.map((e) => e.fullUrl));
    for (const ref of news2.derivedFrom as { reference: string }[]) expect(fullUrls.has(ref.reference)).toBe(true);
    const [encounter] = of("Encounter");
    expect(encounter).toMatchObject({ status: "finished", class: { code: "HH" }, participant: [{ individual: { display: "Grace Mensah" } }] });
    expect((news2.encounter as { reference: string }).reference).toBe(`urn:uuid:${encounter!.id}`);
    const [careTeam] = of("CareTeam");
    expect(careTeam).toMatchObject({ status: "active", managingOrganization: [{ display: "Harbourside Community Nursing Team" }] });
    // Source: UCUM [Ch], Charrière (French gauge).
    const active = of("Device").find((d) => d.status === "active")!;
    expect((active.property as { valueQuantity: { code?: string }[] }[])[0]!.valueQuantity[0]).toMatchObject({ value: 14, unit: "Ch", system: "http://unitsofmeasure.org", code: "[Ch]" });
    expect(active.udiCarrier).toBeTruthy();
  });

  it("writes an audit event for the export", async () => {
    const rows = await db.select().from(auditEvents).where(eq(auditEvents.action, "patient.export.fhir"));
    expect(rows.at(-1)).toMatchObject({ patientId: arthur, via: "care_team" });
  });

  it("the validator is not a rubber stamp: a wrong Device status and an unknown field are errors", () => {
    const broken = JSON.parse(JSON.stringify(bundle)) as Bundle;
    const device = broken.entry.find((e) => e.resource.resourceType === "Device")!.resource;
    device.status = "removed";
    device.colour = "blue";
    const result = new Fhir().validate(broken, { errorOnUnexpected: true });
    expect(result.valid).toBe(false);
    expect(errorsOf(result).map((m) => m.location).sort()).toEqual(["Device.colour", "Device.status"]);
  });

  it("leaves out what was not recorded rather than sending empty values", () => {
    const b = buildFhirBundle({
      identifierSystem: "urn:oid:2.16.840.1.113883.2.1.4.1",
      words: { symptom: (s) => s, failedAction: (a) => a },
      visits: [],
      careTeam: [],
      patient: { id: "6f1c2d8e-4b8a-4a1e-9c7d-1a2b3c4d5e6f", givenName: "Test", familyName: "Person", healthRecordNumber: "T-1", dateOfBirth: "1950-01-01", sex: "female", preferredLocale: "pl" },
      episodes: [{ id: "7f1c2d8e-4b8a-4a1e-9c7d-1a2b3c4d5e60", route: "suprapubic", catheterType: "two-way", material: "all-silicone", sizeCh: 16, balloonMl: 10, maker: null, productName: null, lot: null, expiry: null, gtin: null, serial: null, udi: null, indication: "Retention", insertedAt: new Date("2026-11-01T10:00:00Z"), removedAt: null }],
      observations: [],
    });
    const device = b.entry.find((e) => e.resource.resourceType === "Device")!.resource as Record<string, unknown>;
    for (const k of ["udiCarrier", "lotNumber", "expirationDate", "manufacturer", "serialNumber"]) expect(device).not.toHaveProperty(k);
    expect(errorsOf(new Fhir().validate(b, { errorOnUnexpected: true }))).toEqual([]);
  });
});
