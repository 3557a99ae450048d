import type { SourceId } from "./sources";

/** Enum values shared with the database schema and forms. */
export const ROUTES = ["urethral", "suprapubic"] as const;
export type Route = (typeof ROUTES)[number];

export const CATHETER_TYPES = ["two-way", "three-way"] as const;
export type CatheterType = (typeof CATHETER_TYPES)[number];

export const MATERIALS = [
  "all-silicone",
  "hydrogel-coated-silicone",
  "hydrogel-coated-latex",
  "silicone-coated-latex",
  "ptfe-coated-latex",
  "latex",
] as const;
export type Material = (typeof MATERIALS)[number];

export const LENGTH_CATEGORIES = ["standard", "female", "paediatric"] as const;
export type LengthCategory = (typeof LENGTH_CATEGORIES)[number];

export const GEL_KINDS = ["none", "plain", "lidocaine", "chlorhexidine", "lidocaine-chlorhexidine"] as const;
export type GelKind = (typeof GEL_KINDS)[number];

export const SEXES = ["female", "male", "other", "unknown"] as const;
export type Sex = (typeof SEXES)[number];

export interface Device {
  route: Route;
  catheterType: CatheterType;
  material: Material;
  lengthCategory: LengthCategory;
  sizeCh: number;
  balloonMl: number;
  makerBalloonMl?: number;
  lot?: string;
  /** YYYY-MM-DD */
  expiry?: string;
  gtin?: string;
  gel?: { kind: GelKind; volumeMl?: number };
  largerSizeReason?: string;
  /** The maker's maximum dwell time, entered by the clinician. */
  maxDwellDays?: number;
}

/** `true` = allergic, `false` = asked and not allergic, absent = not known. */
export interface Allergies {
  latex?: boolean;
  chlorhexidine?: boolean;
  lidocaine?: boolean;
}

export interface Patient {
  sex: Sex;
  /** YYYY-MM-DD */
  dateOfBirth?: string;
  allergies: Allergies;
  weightKg?: number;
}

export interface MaterialSpec {
  containsLatex: boolean;
  /** Default maximum dwell when the maker's figure is not entered. */
  defaultMaxDwellDays: number;
  source: SourceId;
}

/**
 * Material facts. Latex content follows from the name. Dwell defaults are common practice
 * with no source; the maker's figure, entered by the clinician, always wins. 12 weeks is
 * used rather than "3 months" (NHS patient pages) because it is the shorter of the two.
 */
export const MATERIAL_SPECS: Record<Material, MaterialSpec> = {
  "all-silicone": { containsLatex: false, defaultMaxDwellDays: 84, source: "common-practice" },
  "hydrogel-coated-silicone": { containsLatex: false, defaultMaxDwellDays: 84, source: "common-practice" },
  "hydrogel-coated-latex": { containsLatex: true, defaultMaxDwellDays: 84, source: "common-practice" },
  "silicone-coated-latex": { containsLatex: true, defaultMaxDwellDays: 84, source: "common-practice" },
  "ptfe-coated-latex": { containsLatex: true, defaultMaxDwellDays: 28, source: "common-practice" },
  // Uncoated latex is for short-term use only; 7 days is the cautious choice.
  latex: { containsLatex: true, defaultMaxDwellDays: 7, source: "common-practice" },
};

export const GEL_CONTENTS: Record<GelKind, { chlorhexidine: boolean; lidocaine: boolean }> = {
  none: { chlorhexidine: false, lidocaine: false },
  plain: { chlorhexidine: false, lidocaine: false },
  lidocaine: { chlorhexidine: false, lidocaine: true },
  chlorhexidine: { chlorhexidine: true, lidocaine: false },
  "lidocaine-chlorhexidine": { chlorhexidine: true, lidocaine: true },
};
