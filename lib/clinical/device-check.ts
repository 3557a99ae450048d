import { parseIsoDate, toDayNumber, type DateInput } from "./dates";
import {
  CATHETER_TYPES,
  GEL_CONTENTS,
  GEL_KINDS,
  LENGTH_CATEGORIES,
  MATERIAL_SPECS,
  MATERIALS,
  ROUTES,
  SEXES,
  type Device,
  type Patient,
} from "./device-types";
import { ClinicalInputError, optionalBoolean, optionalNumber, requireNumber, requireOneOf } from "./errors";
import { isValidGtin } from "./gtin";
import { CH_BOUNDS } from "./size";
import type { SourceId } from "./sources";

export type Severity = "stop" | "warn" | "info";

export interface Finding {
  severity: Severity;
  /** Stable key, e.g. "latex-allergy"; other code translates by it. */
  code: FindingCode;
  /** English text for staff. */
  message: string;
  source: SourceId;
}

export const FINDING_CODES = [
  "device-expired",
  "device-expiring-soon",
  "expiry-missing",
  "lot-missing",
  "gtin-invalid",
  "latex-allergy",
  "latex-allergy-unknown",
  "chlorhexidine-allergy",
  "chlorhexidine-allergy-unknown",
  "chlorhexidine-check-catheter",
  "lidocaine-allergy",
  "lidocaine-allergy-unknown",
  "female-length-male",
  "female-length-sex-unknown",
  "female-length-suprapubic",
  "paediatric-patient",
  "paediatric-length-adult",
  "balloon-differs-from-maker",
  "balloon-not-usual-adult",
  "size-larger-than-routine",
  "dwell-over-12-weeks",
] as const;
export type FindingCode = (typeof FINDING_CODES)[number];

/** Thresholds for checkDevice, each with its source. */
export const DEVICE_RULES = {
  expiryWarnDays: { value: 30, source: "common-practice" },
  usualAdultBalloonMl: { value: 10, source: "handbook-balloon-10ml" },
  /** Urethral: usually 12-14 Ch; warn above 16 so 16 Ch passes without a reason. */
  routineMaxChUrethral: { value: 16, source: "secondary-size-12-14" },
  /** Suprapubic: usually 16 Ch (common practice, no source). */
  routineMaxChSuprapubic: { value: 16, source: "common-practice" },
  adultFromYears: { value: 16, source: "common-practice" },
  maxDwellDays: { value: 84, source: "rcn-2012-dwell" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

export const BALLOON_BOUNDS = { min: 1, max: 60 } as const;

export interface CheckDeviceOptions {
  /** Days before expiry to warn (default 30). */
  expiryWarnDays?: number;
}

const SEVERITY_ORDER: Record<Severity, number> = { stop: 0, warn: 1, info: 2 };

function ageInYears(dob: string, today: number): number {
  const birth = new Date(parseIsoDate("patient.dateOfBirth", dob) * 86_400_000);
  const now = new Date(today * 86_400_000);
  let age = now.getUTCFullYear() - birth.getUTCFullYear();
  const beforeBirthday =
    now.getUTCMonth() < birth.getUTCMonth() ||
    (now.getUTCMonth() === birth.getUTCMonth() && now.getUTCDate() < birth.getUTCDate());
  if (beforeBirthday) age--;
  return age;
}

/**
 * Checks a catheter about to be inserted (or recorded) against the patient. Returns
 * findings sorted stop → warn → info; an empty list means no rule fired, not that the
 * device is right. Throws ClinicalInputError for missing or impossible inputs.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function checkDevice(
  device: Device,
  patient: Patient,
  today?: DateInput,
  options: CheckDeviceOptions = {},
): Finding[] {
  if (!device || typeof device !== "object") throw new ClinicalInputError("device", "missing", "device is required");
  if (!patient || typeof patient !== "object") throw new ClinicalInputError("patient", "missing", "patient is required");
  const route = requireOneOf("device.route", device.route, ROUTES);
  requireOneOf("device.catheterType", device.catheterType, CATHETER_TYPES);
  const material = requireOneOf("device.material", device.material, MATERIALS);
  const length = requireOneOf("device.lengthCategory", device.lengthCategory, LENGTH_CATEGORIES);
  const sizeCh = requireNumber("device.sizeCh", device.sizeCh, CH_BOUNDS.min, CH_BOUNDS.max);
  const balloonMl = requireNumber("device.balloonMl", device.balloonMl, BALLOON_BOUNDS.min, BALLOON_BOUNDS.max);
  const makerBalloonMl = optionalNumber("device.makerBalloonMl", device.makerBalloonMl, BALLOON_BOUNDS.min, BALLOON_BOUNDS.max);
  const maxDwellDays = optionalNumber("device.maxDwellDays", device.maxDwellDays, 1, 366);
  const gelKind = device.gel ? requireOneOf("device.gel.kind", device.gel.kind, GEL_KINDS) : "none";
  const sex = requireOneOf("patient.sex", patient.sex, SEXES);
  if (!patient.allergies || typeof patient.allergies !== "object") {
    throw new ClinicalInputError("patient.allergies", "missing", "allergies are required (leave a field out when not known)");
  }
  const latexAllergy = optionalBoolean("patient.allergies.latex", patient.allergies.latex);
  const chxAllergy = optionalBoolean("patient.allergies.chlorhexidine", patient.allergies.chlorhexidine);
  const lidoAllergy = optionalBoolean("patient.allergies.lidocaine", patient.allergies.lidocaine);
  const day = toDayNumber("today", today);
  const warnDays = optionalNumber("options.expiryWarnDays", options.expiryWarnDays, 0, 3650) ?? DEVICE_RULES.expiryWarnDays.value;

  const findings: Finding[] = [];
  const add = (severity: Severity, code: FindingCode, message: string, source: SourceId) =>
    findings.push({ severity, code, message, source });

  // Expiry and traceability
  if (device.expiry === undefined || device.expiry === "") {
    add("warn", "expiry-missing", "No expiry date recorded: check the label before use.", "eaun-2012-ch12");
  } else {
    const expiry = parseIsoDate("device.expiry", device.expiry);
    if (day > expiry) {
      add("stop", "device-expired", `Expired on ${device.expiry}: do not use this catheter.`, "gs1-genspecs");
    } else if (expiry - day <= warnDays) {
      add("warn", "device-expiring-soon", `Expires on ${device.expiry}, within ${warnDays} days.`, "common-practice");
    }
  }
  if (typeof device.lot !== "string" || device.lot.trim() === "") {
    add("info", "lot-missing", "No lot (batch) number recorded.", "eaun-2012-ch12");
  }
  if (device.gtin !== undefined && device.gtin !== null && device.gtin !== "" && !isValidGtin(device.gtin)) {
    add("warn", "gtin-invalid", "The product number (GTIN) has a wrong check digit: rescan or retype it.", "gs1-genspecs");
  }

  // Allergies
  if (MATERIAL_SPECS[material].containsLatex) {
    if (latexAllergy === true) {
      add("stop", "latex-allergy", "Latex allergy: this catheter contains latex. Use an all-silicone catheter.", "latex-ask-before");
    } else if (latexAllergy === undefined) {
      add("warn", "latex-allergy-unknown", "This catheter contains latex and latex allergy is not recorded: ask first.", "latex-ask-before");
    }
  }
  const gel = GEL_CONTENTS[gelKind];
  if (gel.chlorhexidine) {
    if (chxAllergy === true) {
      add("stop", "chlorhexidine-allergy", "Chlorhexidine allergy: this gel contains chlorhexidine (risk of anaphylaxis).", "mhra-mda-2012-075");
    } else if (chxAllergy === undefined) {
      add("warn", "chlorhexidine-allergy-unknown", "This gel contains chlorhexidine and chlorhexidine allergy is not recorded: ask first.", "mhra-mda-2012-075");
    }
  }
  if (chxAllergy === true) {
    add("info", "chlorhexidine-check-catheter", "Chlorhexidine allergy: catheters can contain chlorhexidine too; check the label.", "mhra-mda-2012-075");
  }
  if (gel.lidocaine) {
    if (lidoAllergy === true) {
      add("stop", "lidocaine-allergy", "Lidocaine allergy: this gel contains lidocaine.", "common-practice");
    } else if (lidoAllergy === undefined) {
      add("warn", "lidocaine-allergy-unknown", "This gel contains lidocaine and lidocaine allergy is not recorded: ask first.", "common-practice");
    }
  }

  // Length category
  if (length === "female") {
    if (route === "suprapubic") {
      add("info", "female-length-suprapubic", "Female-length catheter in a suprapubic tract: commonly used; follow local policy.", "common-practice");
    } else if (sex === "male") {
      add("stop", "female-length-male", "Female-length catheter in a male urethra: the balloon would inflate in the urethra.", "common-practice");
    } else if (sex === "other" || sex === "unknown") {
      add("warn", "female-length-sex-unknown", "Female-length catheter: use only for a female urethra; the balloon must inflate in the bladder.", "common-practice");
    }
  }

  // Age: adult size and balloon rules do not apply to children.
  const age = patient.dateOfBirth ? ageInYears(patient.dateOfBirth, day) : undefined;
  const child = age !== undefined && age < DEVICE_RULES.adultFromYears.value;
  if (child) {
    add("warn", "paediatric-patient", "Under 16: adult size and balloon rules do not apply; follow paediatric guidance.", "common-practice");
  } else if (age !== undefined && length === "paediatric") {
    add("warn", "paediatric-length-adult", "Paediatric-length catheter recorded for an adult.", "common-practice");
  }

  if (!child) {
    const usual = DEVICE_RULES.usualAdultBalloonMl.value;
    if (makerBalloonMl !== undefined && balloonMl !== makerBalloonMl) {
      add("warn", "balloon-differs-from-maker", `Balloon ${balloonMl} ml differs from the maker's ${makerBalloonMl} ml.`, "handbook-balloon-10ml");
    } else if (balloonMl !== usual) {
      // Matching the maker (e.g. a 30 ml three-way balloon) only needs a note.
      const severity: Severity = makerBalloonMl === balloonMl ? "info" : "warn";
      add(severity, "balloon-not-usual-adult", `Balloon ${balloonMl} ml: the usual adult volume is ${usual} ml of sterile water.`, "handbook-balloon-10ml");
    }
    const rule = route === "urethral" ? DEVICE_RULES.routineMaxChUrethral : DEVICE_RULES.routineMaxChSuprapubic;
    if (sizeCh > rule.value && !(typeof device.largerSizeReason === "string" && device.largerSizeReason.trim())) {
      add("warn", "size-larger-than-routine", `${sizeCh} Ch is larger than routine (over ${rule.value} Ch): record the reason.`, rule.source);
    }
  }

  if (maxDwellDays !== undefined && maxDwellDays > DEVICE_RULES.maxDwellDays.value) {
    add("warn", "dwell-over-12-weeks", `Maximum dwell ${maxDwellDays} days is over 12 weeks: check the maker's instructions.`, "rcn-2012-dwell");
  }

  return findings.sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);
}

/** The worst severity in a list of findings, or undefined when there are none. */
export function worstSeverity(findings: readonly Finding[]): Severity | undefined {
  return findings.reduce<Severity | undefined>(
    (worst, f) => (worst === undefined || SEVERITY_ORDER[f.severity] < SEVERITY_ORDER[worst] ? f.severity : worst),
    undefined,
  );
}

