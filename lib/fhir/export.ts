import "server-only";
// A patient's record as a FHIR R4 Bundle (type "collection"): Patient, one Device and one
// DeviceUseStatement per catheter, and one Observation per NEWS2 score. Pure: the caller loads
// the rows and checks access. References are urn:uuid full URLs inside the Bundle.
// Codes: SNOMED CT 23973005 "Indwelling urinary catheter, device" (HL7 R4 device-kind value set)
// and UK SNOMED 1104051000000101 for the NEWS2 total (a public FHIR implementation guide), both
// as seen in /work/shared/references/clinical-checks.md section 8.

export type FhirInput = {
  patient: {
    id: string;
    givenName: string;
    familyName: string;
    healthRecordNumber: string;
    dateOfBirth: string;
    sex: "female" | "male" | "other" | "unknown";
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
  observations: {
    id: string;
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
  /** Deployment base for identifier systems, e.g. https://caddis.example.org */
  base: string;
  now?: Date;
};

const SNOMED = "http://snomed.info/sct";
const urn = (id: string) => `urn:uuid:${id}`;

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
      identifier: [{ use: "usual", system: `${input.base}/fhir/health-record-number`, value: p.healthRecordNumber }],
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
        { type: { text: "Size (Charrière)" }, valueQuantity: [{ value: e.sizeCh, unit: "Ch" }] },
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
  for (const o of input.observations) {
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
        valueInteger: o.total,
        interpretation: [{ text: `NEWS2 risk: ${o.risk}` }],
        note: [
          {
            text: `RR ${o.respirationRate}/min; SpO2 ${o.spo2} % (scale ${o.spo2Scale}, ${o.onOxygen ? "oxygen" : "air"}); SBP ${o.systolicBp} mmHg; pulse ${o.pulse}/min; ACVPU ${o.consciousness}; ${o.temperatureC.toFixed(1)} °C`,
          },
        ],
        component: Object.entries(o.subscores).map(([k, v]) => ({ code: { text: SUBSCORE_TEXT[k] ?? k }, valueInteger: v })),
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

/** A stable id of the use statement, derived from the episode id (last hex digit flipped). */
export function deviceUseStatementId(episodeId: string): string {
  const last = episodeId.slice(-1);
  const flipped = ((parseInt(last, 16) ^ 0xf) >>> 0).toString(16);
  return `${episodeId.slice(0, -1)}${flipped}`;
}
