import "server-only";
// A patient's record as a FHIR R4 Bundle (type "collection"): Patient, the CareTeam, one Device
// and one DeviceUseStatement per catheter, one Encounter per visit, and per set of observations
// one NEWS2 Observation derived from one vital-sign Observation per measurement (LOINC codes,
// UCUM units). Pure: the caller loads the rows and checks access. References are urn:uuid full
// URLs inside the Bundle.
// Codes: SNOMED CT 23973005 "Indwelling urinary catheter, device" (HL7 FHIR R4, value set
// device-kind) and the UK edition of SNOMED CT's 1104051000000101, the NEWS2 total score
// (NHS England's UK Core FHIR implementation guide uses it for the NEWS2 observation).
// A trial without catheter: one Observation of its outcome (symptoms as components, the reason as
// a note) with a member Observation per voided volume and one for the post-void residual.
import type { Sex, TwocFailedAction, TwocOutcome, TwocSymptom } from "@/lib/clinical";
import type { TwocResult } from "@/lib/shared/twoc-result";

export type FhirInput = {
  patient: {
    id: string;
    givenName: string;
    familyName: string;
    healthRecordNumber: string;
    dateOfBirth: string;
    sex: Sex;
    preferredLocale: string;
  };
  episodes: {
    id: string;
    route: string;
    catheterType: string;
    material: string;
    sizeCh: number;
    balloonMl: number;
    maker: string | null;
    productName: string | null;
    lot: string | null;
    expiry: string | null;
    gtin: string | null;
    serial: string | null;
    udi: string | null;
    indication: string;
    insertedAt: Date;
    removedAt: Date | null;
  }[];
  /** Visits (episode events of kind visit): each an Encounter. */
  visits: { id: string; occurredAt: Date; recordedByName: string; organisationName: string | null }[];
  /** The care-team organisations; `lead` marks the team alerts go to. */
  careTeam: { id: string; name: string; lead: boolean }[];
  observations: {
    id: string;
    eventId: string | null;
    takenAt: Date;
    total: number;
    subscores: Record<string, number>;
    risk: string;
    respirationRate: number;
    spo2: number;
    spo2Scale: number;
    onOxygen: boolean;
    systolicBp: number;
    pulse: number;
    consciousness: string;
    temperatureC: number;
    recordedByName: string;
  }[];
  /** Outcomes of trials without catheter, read with twocResult (lib/shared/twoc-result.ts). */
  trials?: { id: string; episodeId: string; occurredAt: Date; outcome: TwocOutcome; result: TwocResult; recordedByName: string }[];
  /** The health record number's identifier system (a namespace URI from configuration). */
  identifierSystem: string;
  /** The record vocabulary's words (the English catalogue's), so a reader sees words, not stored keys. */
  words: { symptom: (s: TwocSymptom) => string; failedAction: (a: TwocFailedAction) => string };
  now?: Date;
};

const SNOMED = "http://snomed.info/sct";
const LOINC = "http://loinc.org";
const UCUM = "http://unitsofmeasure.org";
const VITAL_SIGNS = [{ coding: [{ system: "http://terminology.hl7.org/CodeSystem/observation-category", code: "vital-signs", display: "Vital Signs" }] }];

/** A stable id for the n-th vital sign of an observation: its last 12 hex digits shifted by n. */
function childId(parent: string, n: number): string {
  const tail = parent.slice(-12);
  const mixed = ((parseInt(tail, 16) + n * 0x1000_0000_01) % 0x1_0000_0000_0000).toString(16).padStart(12, "0");
  return `${parent.slice(0, -12)}${mixed}`;
}

// Source: LOINC vital-sign codes as the HL7 FHIR R4 vital signs profiles use them (9279-1
// respiratory rate, 59408-5 SpO2 by pulse oximetry, 8480-6 systolic BP, 8867-4 heart rate,
// 8310-5 body temperature); UCUM units /min, %, mm[Hg], Cel. ACVPU: LOINC 67775-7 level of
// responsiveness (from memory).
const VITALS = [
  { key: "respirationRate", code: "9279-1", display: "Respiratory rate", unit: "/min", ucum: "/min" },
  { key: "spo2", code: "59408-5", display: "Oxygen saturation in Arterial blood by Pulse oximetry", unit: "%", ucum: "%" },
  { key: "systolicBp", code: "8480-6", display: "Systolic blood pressure", unit: "mmHg", ucum: "mm[Hg]" },
  { key: "pulse", code: "8867-4", display: "Heart rate", unit: "/min", ucum: "/min" },
  { key: "temperatureC", code: "8310-5", display: "Body temperature", unit: "°C", ucum: "Cel" },
] as const;
const urn = (id: string) => `urn:uuid:${id}`;

// Source: LOINC 9187-6 "Urine output" (volume of urine, in mL), from memory; UCUM mL. No LOINC
// code for a post-void residual measured by bladder scan could be confirmed, so that one is coded
// by text only (FHIR allows a CodeableConcept with text alone).
const URINE_VOLUME = { system: LOINC, code: "9187-6", display: "Urine output" } as const;
const ML = (value: number) => ({ value, unit: "ml", system: UCUM, code: "mL" });
const TWOC_OUTCOME_TEXT: Record<TwocOutcome, string> = { passed: "Passed", failed: "Failed", abandoned: "Abandoned" };

const SUBSCORE_TEXT: Record<string, string> = {
  respirationRate: "NEWS2 respiration rate score",
  spo2: "NEWS2 SpO2 score",
  air: "NEWS2 air or oxygen score",
  systolicBp: "NEWS2 systolic blood pressure score",
  pulse: "NEWS2 pulse score",
  consciousness: "NEWS2 consciousness score",
  temperature: "NEWS2 temperature score",
};

export function buildFhirBundle(input: FhirInput) {
  const { patient: p } = input;
  const patientRef = { reference: urn(p.id) };
  const entries: { fullUrl: string; resource: Record<string, unknown> }[] = [];
  entries.push({
    fullUrl: urn(p.id),
    resource: {
      resourceType: "Patient",
      id: p.id,
      identifier: [{ use: "usual", system: input.identifierSystem, value: p.healthRecordNumber }],
      name: [{ use: "official", family: p.familyName, given: [p.givenName] }],
      gender: p.sex,
      birthDate: p.dateOfBirth,
      communication: [{ language: { coding: [{ system: "urn:ietf:bcp:47", code: p.preferredLocale }] }, preferred: true }],
    },
  });
  for (const e of input.episodes) {
    const deviceId = e.id;
    const statementId = deviceUseStatementId(e.id);
    const device: Record<string, unknown> = {
      resourceType: "Device",
      id: deviceId,
      status: e.removedAt ? "inactive" : "active",
      type: { coding: [{ system: SNOMED, code: "23973005", display: "Indwelling urinary catheter, device" }], text: `${e.route} ${e.catheterType} catheter` },
      patient: patientRef,
      property: [
        // Source: UCUM, [Ch] (Charrière, French) — a catheter's outer circumference in thirds of a millimetre.
        { type: { text: "Size (Charrière)" }, valueQuantity: [{ value: e.sizeCh, unit: "Ch", system: UCUM, code: "[Ch]" }] },
        { type: { text: "Balloon volume" }, valueQuantity: [{ value: e.balloonMl, unit: "ml", system: "http://unitsofmeasure.org", code: "mL" }] },
        { type: { text: "Material" }, valueCode: [{ text: e.material }] },
      ],
    };
    if (e.gtin || e.udi) device.udiCarrier = [{ ...(e.gtin ? { deviceIdentifier: e.gtin } : {}), ...(e.udi ? { carrierHRF: e.udi } : {}) }];
    if (e.maker) device.manufacturer = e.maker;
    if (e.lot) device.lotNumber = e.lot;
    if (e.serial) device.serialNumber = e.serial;
    if (e.expiry) device.expirationDate = e.expiry;
    if (e.productName) device.deviceName = [{ name: e.productName, type: "user-friendly-name" }];
    entries.push({ fullUrl: urn(deviceId), resource: device });
    entries.push({
      fullUrl: urn(statementId),
      resource: {
        resourceType: "DeviceUseStatement",
        id: statementId,
        status: e.removedAt ? "completed" : "active",
        subject: patientRef,
        device: { reference: urn(deviceId) },
        timingPeriod: { start: e.insertedAt.toISOString(), ...(e.removedAt ? { end: e.removedAt.toISOString() } : {}) },
        recordedOn: e.insertedAt.toISOString(),
        reasonCode: [{ text: e.indication }],
      },
    });
  }
  if (input.careTeam.length) {
    const lead = input.careTeam.find((t) => t.lead);
    entries.push({
      fullUrl: urn(careTeamId(p.id)),
      resource: {
        resourceType: "CareTeam",
        id: careTeamId(p.id),
        status: "active",
        name: "Catheter care team",
        subject: patientRef,
        participant: input.careTeam.map((t) => ({
          ...(t.lead ? { role: [{ text: "Lead team" }] } : {}),
          member: { display: t.name },
        })),
        ...(lead ? { managingOrganization: [{ display: lead.name }] } : {}),
      },
    });
  }
  for (const v of input.visits) {
    entries.push({
      fullUrl: urn(v.id),
      resource: {
        resourceType: "Encounter",
        id: v.id,
        status: "finished",
        // Source: HL7 v3 ActCode HH, home health.
        class: { system: "http://terminology.hl7.org/CodeSystem/v3-ActCode", code: "HH", display: "home health" },
        subject: patientRef,
        participant: [{ individual: { display: v.recordedByName } }],
        period: { start: v.occurredAt.toISOString() },
        ...(v.organisationName ? { serviceProvider: { display: v.organisationName } } : {}),
      },
    });
  }
  const visitIds = new Set(input.visits.map((v) => v.id));
  for (const o of input.observations) {
    const encounter = o.eventId && visitIds.has(o.eventId) ? { encounter: { reference: urn(o.eventId) } } : {};
    const vitals = VITALS.map((vital, i) => ({ id: childId(o.id, i + 1), vital, value: o[vital.key] }));
    entries.push({
      fullUrl: urn(o.id),
      resource: {
        resourceType: "Observation",
        id: o.id,
        status: "final",
        category: [{ coding: [{ system: "http://terminology.hl7.org/CodeSystem/observation-category", code: "survey", display: "Survey" }] }],
        code: {
          coding: [{ system: SNOMED, code: "1104051000000101", display: "Royal College of Physicians National Early Warning Score 2 (NEWS2) total score" }],
          text: "NEWS2 total score",
        },
        subject: patientRef,
        effectiveDateTime: o.takenAt.toISOString(),
        performer: [{ display: o.recordedByName }],
        ...encounter,
        valueInteger: o.total,
        derivedFrom: vitals.map((v) => ({ reference: urn(v.id) })),
        interpretation: [{ text: `NEWS2 risk: ${o.risk}` }],
        note: [
          {
            text: `RR ${o.respirationRate}/min; SpO2 ${o.spo2} % (scale ${o.spo2Scale}, ${o.onOxygen ? "oxygen" : "air"}); SBP ${o.systolicBp} mmHg; pulse ${o.pulse}/min; ACVPU ${o.consciousness}; ${o.temperatureC.toFixed(1)} °C`,
          },
        ],
        component: Object.entries(o.subscores).map(([k, v]) => ({ code: { text: SUBSCORE_TEXT[k] ?? k }, valueInteger: v })),
      },
    });
    for (const v of vitals) {
      entries.push({
        fullUrl: urn(v.id),
        resource: {
          resourceType: "Observation",
          id: v.id,
          status: "final",
          category: VITAL_SIGNS,
          code: { coding: [{ system: LOINC, code: v.vital.code, display: v.vital.display }], text: v.vital.display },
          subject: patientRef,
          ...encounter,
          effectiveDateTime: o.takenAt.toISOString(),
          performer: [{ display: o.recordedByName }],
          valueQuantity: { value: v.value, unit: v.vital.unit, system: UCUM, code: v.vital.ucum },
          ...(v.vital.key === "spo2" ? { note: [{ text: `NEWS2 SpO2 scale ${o.spo2Scale}, on ${o.onOxygen ? "oxygen" : "air"}` }] } : {}),
        },
      });
    }
    const acvpuId = childId(o.id, VITALS.length + 1);
    entries.push({
      fullUrl: urn(acvpuId),
      resource: {
        resourceType: "Observation",
        id: acvpuId,
        status: "final",
        category: VITAL_SIGNS,
        code: { coding: [{ system: LOINC, code: "67775-7", display: "Level of responsiveness" }], text: "ACVPU" },
        subject: patientRef,
        ...encounter,
        effectiveDateTime: o.takenAt.toISOString(),
        performer: [{ display: o.recordedByName }],
        valueCodeableConcept: { text: o.consciousness },
      },
    });
  }
  for (const trial of input.trials ?? []) {
    const r = trial.result;
    const base = {
      status: "final",
      subject: patientRef,
      focus: [{ reference: urn(trial.episodeId) }],
      effectiveDateTime: trial.occurredAt.toISOString(),
      performer: [{ display: trial.recordedByName }],
    };
    const members: string[] = [];
    // Each void and the residual: an Observation of its own, a member of the trial's outcome.
    const member = (id: string, fields: Record<string, unknown>) => {
      members.push(id);
      entries.push({ fullUrl: urn(id), resource: { resourceType: "Observation", id, ...base, ...fields } });
    };
    r.voids.forEach((v, i) =>
      member(childId(trial.id, i + 1), {
        code: { coding: [URINE_VOLUME], text: `Voided volume ${i + 1} (trial without catheter)` },
        valueQuantity: ML(v.volumeMl),
        ...(v.at ? { note: [{ text: `Passed at ${v.at} (local time)` }] } : {}),
      }),
    );
    if (r.postVoidResidualMl !== null) {
      member(childId(trial.id, 30), { code: { text: "Post-void residual urine volume (bladder scan)" }, valueQuantity: ML(r.postVoidResidualMl) });
    }
    const notes = [r.reason ? `Reason: ${r.reason}` : null, r.failedAction ? `What was done: ${input.words.failedAction(r.failedAction)}` : null].filter((n): n is string => n !== null);
    entries.push({
      fullUrl: urn(trial.id),
      resource: {
        resourceType: "Observation",
        id: trial.id,
        ...base,
        code: { text: "Trial without catheter (TWOC) outcome" },
        valueCodeableConcept: { text: TWOC_OUTCOME_TEXT[trial.outcome] },
        ...(members.length ? { hasMember: members.map((id) => ({ reference: urn(id) })) } : {}),
        ...(r.symptoms.length ? { component: r.symptoms.map((s) => ({ code: { text: "Symptom during the trial" }, valueString: input.words.symptom(s) })) } : {}),
        ...(notes.length ? { note: notes.map((text) => ({ text })) } : {}),
      },
    });
  }
  return {
    resourceType: "Bundle",
    type: "collection",
    timestamp: (input.now ?? new Date()).toISOString(),
    entry: entries,
  };
}

/** The patient's one CareTeam: a stable id from the patient id (first hex digit flipped). */
function careTeamId(patientId: string): string {
  const first = ((parseInt(patientId[0]!, 16) ^ 0xf) >>> 0).toString(16);
  return `${first}${patientId.slice(1)}`;
}

/** A stable id of the use statement, derived from the episode id (last hex digit flipped). */
export function deviceUseStatementId(episodeId: string): string {
  const last = episodeId.slice(-1);
  const flipped = ((parseInt(last, 16) ^ 0xf) >>> 0).toString(16);
  return `${episodeId.slice(0, -1)}${flipped}`;
}
