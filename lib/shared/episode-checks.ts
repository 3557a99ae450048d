// The device checks as the forms and the route handlers both run them: the same inputs to
// lib/clinical's checkDevice, and the same rule that every `stop` needs an override reason.
// Pure: runs in the browser for live feedback and again on the server when saving.
import {
  checkDevice,
  ClinicalInputError,
  type Device,
  type Finding,
  type FindingCode,
  allergyKnown,
  type AllergyAnswers,
  type GelKind,
  type Patient,
} from "@/lib/clinical";
import { OVERRIDE_MIN_CHARS } from "@/lib/validations/episode";
import { dayIn } from "@/lib/shared/time-zone";

export type DeviceDraft = {
  route?: unknown;
  catheterType?: unknown;
  material?: unknown;
  lengthCategory?: unknown;
  sizeCh?: unknown;
  balloonMl?: unknown;
  makerBalloonMl?: unknown;
  lot?: unknown;
  expiry?: unknown;
  gtin?: unknown;
  gelKind?: unknown;
  gelVolumeMl?: unknown;
  largerSizeReason?: unknown;
  maxDwellDays?: unknown;
};

export type PatientFacts = {
  sex: Patient["sex"];
  dateOfBirth: string;
  allergies: AllergyAnswers;
};

const blank = (v: unknown) => v === undefined || v === null || v === "" || (typeof v === "number" && Number.isNaN(v));
const num = (v: unknown) => (blank(v) ? undefined : typeof v === "string" ? Number(v) : (v as number));
const str = (v: unknown) => (blank(v) ? undefined : String(v).trim() || undefined);

/** A draft from the form (strings and NaN allowed) → the Device checkDevice reads. */
export function toDevice(d: DeviceDraft): Device {
  const gelKind = str(d.gelKind) as GelKind | undefined;
  return {
    route: str(d.route) as Device["route"],
    catheterType: str(d.catheterType) as Device["catheterType"],
    material: str(d.material) as Device["material"],
    lengthCategory: str(d.lengthCategory) as Device["lengthCategory"],
    sizeCh: num(d.sizeCh) as number,
    balloonMl: num(d.balloonMl) as number,
    makerBalloonMl: num(d.makerBalloonMl),
    lot: str(d.lot),
    expiry: str(d.expiry),
    gtin: str(d.gtin),
    gel: gelKind ? { kind: gelKind, volumeMl: num(d.gelVolumeMl) } : undefined,
    largerSizeReason: str(d.largerSizeReason),
    maxDwellDays: num(d.maxDwellDays),
  };
}

export function toClinicalPatient(p: PatientFacts): Patient {
  // "not asked" reaches checkDevice as not known, so it warns "not recorded: ask first".
  const a = p.allergies;
  return {
    sex: p.sex,
    dateOfBirth: p.dateOfBirth,
    allergies: { latex: allergyKnown(a.latex), chlorhexidine: allergyKnown(a.chlorhexidine), lidocaine: allergyKnown(a.lidocaine) },
  };
}

export type CheckOutcome =
  | { ok: true; findings: Finding[] }
  /** The draft is not complete enough to check: `field` names the first missing input. */
  | { ok: false; field: string; code: ClinicalInputError["code"] };

/**
 * checkDevice on the calendar day of the insertion in the deployment's zone (a device that
 * expired before it went in is what matters, not whether it has expired since).
 */
export function runDeviceCheck(draft: DeviceDraft, patient: PatientFacts, at: Date, timeZone: string): CheckOutcome {
  try {
    return { ok: true, findings: checkDevice(toDevice(draft), toClinicalPatient(patient), dayIn(at, timeZone)) };
  } catch (e) {
    if (e instanceof ClinicalInputError) return { ok: false, field: e.field.replace(/^device\./, ""), code: e.code };
    throw e;
  }
}

export type OverrideEntry = { code: string; reason: string };

/**
 * The stops that still lack an override reason of at least OVERRIDE_MIN_CHARS characters, and
 * the overrides to keep (only those that answer a stop in these findings).
 */
export function reconcileOverrides(findings: readonly Finding[], overrides: readonly OverrideEntry[]) {
  const stops = findings.filter((f) => f.severity === "stop");
  const byCode = new Map(overrides.map((o) => [o.code, o.reason.trim()]));
  const missing: FindingCode[] = [];
  const kept: OverrideEntry[] = [];
  for (const s of stops) {
    const reason = byCode.get(s.code);
    if (!reason || reason.length < OVERRIDE_MIN_CHARS) missing.push(s.code);
    else kept.push({ code: s.code, reason });
  }
  return { missing, kept };
}
