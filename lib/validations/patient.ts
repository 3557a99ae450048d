// One schema for registering and editing a patient, shared by the form (zodResolver) and the
// route handlers. Error messages are keys of PatientForm.errors, so the client shows the same
// translated message whether the client or the server found the problem.
import { z } from "zod";
import { multiLine, singleLine } from "./text";
import { ALLERGY_ANSWERS } from "@/lib/clinical/allergies";
import { locales } from "@/lib/i18n/routing";
import { numberIn, toNumber } from "./number";

export const patientSexes = ["female", "male", "other", "unknown"] as const;
export const patientLocales = locales;

/** Free format per deployment: 3–20 letters, digits, spaces or hyphens, kept upper-case. */
export const HRN_PATTERN = /^(?=.*[A-Z0-9])[A-Z0-9 -]{3,20}$/;
export const EARLIEST_BIRTH_DATE = "1900-01-01";
export const WEIGHT_KG = { min: 1, max: 400 } as const;

/** Today's calendar date (UTC) as YYYY-MM-DD; a birth date after it is in the future everywhere. */
function latestBirthDate(): string {
  // A day of slack so someone born "today" east of UTC is not refused.
  return new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10);
}

const name = singleLine(z.string({ error: "required" }).trim().min(1, { error: "required" }).max(100, { error: "too_long" }));

const optionalText = (max: number) =>
  z
    .string({ error: "too_long" })
    .trim()
    .max(max, { error: "too_long" })
    .pipe(singleLine(z.string()))
    .nullish()
    .transform((v) => (v ? v : null));

export const patientSchema = z.object({
  givenName: name,
  familyName: name,
  healthRecordNumber: z
    .string({ error: "required" })
    .trim()
    .toUpperCase()
    .min(1, { error: "required" })
    .regex(HRN_PATTERN, { error: "hrn_format" }),
  dateOfBirth: z
    .string({ error: "required" })
    .min(1, { error: "required" })
    .pipe(z.iso.date({ error: "date_invalid" }))
    .refine((d) => d >= EARLIEST_BIRTH_DATE, { error: "dob_too_early" })
    .refine((d) => d <= latestBirthDate(), { error: "dob_future" }),
  sex: z.enum(patientSexes, { error: "required" }),
  preferredLocale: z.enum(patientLocales, { error: "required" }),
  weightKg: z
    .preprocess(toNumber, numberIn({ ...WEIGHT_KG, unit: "kg" }).nullish())
    .transform((v) => (v === undefined || v === null ? null : Math.round(v * 10) / 10)),
  // Each one yes, no or "not-asked" (the form's starting value): never a silent "no".
  allergies: z.object({
    latex: z.enum(ALLERGY_ANSWERS, { error: "required" }),
    chlorhexidine: z.enum(ALLERGY_ANSWERS, { error: "required" }),
    lidocaine: z.enum(ALLERGY_ANSWERS, { error: "required" }),
    other: optionalText(200),
  }),
  gpPracticeId: z.uuid({ error: "gp_required" }),
  careTeamOrganisationIds: z
    .array(z.uuid({ error: "care_team_required" }), { error: "care_team_required" })
    .min(1, { error: "care_team_required" })
    .max(10, { error: "care_team_required" }),
});

export type PatientInput = z.input<typeof patientSchema>;
export type PatientValues = z.output<typeof patientSchema>;

/** Editing the details: any subset of the fields; the care team is changed elsewhere. */
export const patientUpdateSchema = patientSchema
  .omit({ careTeamOrganisationIds: true })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: "nothing_to_change", path: ["_form"] });

export type PatientUpdateInput = z.input<typeof patientUpdateSchema>;
export type PatientUpdateValues = z.output<typeof patientUpdateSchema>;

/** Every message key the schema can produce (PatientForm.errors.<key> in the catalogues). */
export const patientErrorKeys = [
  "required",
  "too_long",
  "hrn_format",
  "hrn_taken",
  "date_invalid",
  "dob_too_early",
  "dob_future",
  "weight_range",
  "gp_required",
  "gp_unknown",
  "care_team_required",
  "care_team_not_yours",
  "nothing_to_change",
] as const;
export type PatientErrorKey = (typeof patientErrorKeys)[number];
