import { z } from "zod";
import { singleLine } from "./text";
import { MATERIALS } from "@/lib/clinical";
import { locales } from "@/lib/i18n/routing";
import { todayIso } from "@/lib/shared/time-zone";
import { numberIn, toNumber } from "./number";
import { phoneSchema } from "./organisation";

// Deployment settings (the `settings` table, key → JSON value). Messages are codes that the
// settings form translates (AdminSettings.errors.<code>).

/** Digits only: what a patient dials (999, 112, 911, 000…). */
export const emergencyNumberSchema = z.string().trim().regex(/^[0-9]{2,6}$/, { message: "emergency_digits" });

const minutes = (min: number, max: number) => z.preprocess(toNumber, numberIn({ min, max, unit: "minutes", whole: true }));
/** A time of day, "08:00" (the working hours an acknowledgement is counted in). */
const clock = z.string().trim().regex(/^([01]\d|2[0-3]):[0-5]\d$/, { message: "clock_time" });

const days = (min: number, max: number) => z.preprocess(toNumber, numberIn({ min, max, unit: "days", whole: true, missing: "whole_days" }));

/** ISO 3166 two-letter region whose conventions dates and numbers follow (GB: 3 December, 24-hour). */
export const regionSchema = z.string().trim().toUpperCase().regex(/^[A-Z]{2}$/, { message: "region_code" });

/** The languages translated from English, whose patient texts a medical translator reviews. */
export const TRANSLATED_LOCALES = locales.filter((l): l is Exclude<(typeof locales)[number], "en"> => l !== "en");
export type TranslatedLocale = (typeof TRANSLATED_LOCALES)[number];

/** Who reviewed one language's patient texts, and on which day (not in the future). */
export const translationReviewSchema = z.object({
  reviewerName: singleLine(z.string().trim().min(2, { message: "name_length" }).max(120, { message: "name_length" })),
  reviewedOn: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, { message: "date" })
    .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), { message: "date" })
    .refine((d) => d <= todayIso(), { message: "date_future" }),
});
export type TranslationReview = z.infer<typeof translationReviewSchema>;

export const settingSchemas = {
  emergencyNumber: emergencyNumberSchema,
  region: regionSchema,
  outOfHoursServiceName: singleLine(z.string().trim().min(2, { message: "name_length" }).max(120, { message: "name_length" })),
  reviewIntervalDays: days(1, 365),
  dueSoonDays: days(0, 60),
  defaultMaxDwellDays: z.partialRecord(z.enum(MATERIALS), days(1, 365)),
  retentionDays: days(30, 100 * 365),
  acknowledgeWithinMinutes: minutes(15, 24 * 60),
  workingDayStart: clock,
  workingDayEnd: clock,
  // The deployment's out-of-hours service: the number shown where the lead team has none of its own.
  outOfHoursPhone: phoneSchema.pipe(z.string()),
  // Hours a referral may stay unanswered before it is flagged and sent again (default in settings.ts).
  referralReminderHours: z.preprocess(toNumber, numberIn({ min: 1, max: 168, unit: "hours", whole: true })),
  /** Per translated language: the medical translator's review of the patient texts. */
  translationReviews: z.partialRecord(z.enum(TRANSLATED_LOCALES), translationReviewSchema),
  // Hours after a removal for a trial without catheter by which the patient should have passed urine.
  twocVoidWindowHours: z.preprocess(toNumber, numberIn({ min: 1, max: 24, unit: "hours", whole: true })),
  // Spare catheters (each with its gel) on top of the planned changes in a supply request.
  spareCatheters: z.preprocess(toNumber, numberIn({ min: 0, max: 5, unit: "items", whole: true })),
} as const;

export type SettingKey = keyof typeof settingSchemas;
export const settingKeys = Object.keys(settingSchemas) as SettingKey[];

/** A change: each key set to a value, or null to clear it. Unknown keys are refused. */
export const settingsPatchSchema = z
  .object({
    emergencyNumber: settingSchemas.emergencyNumber.nullable(),
    region: settingSchemas.region.nullable(),
    outOfHoursServiceName: settingSchemas.outOfHoursServiceName.nullable(),
    reviewIntervalDays: settingSchemas.reviewIntervalDays.nullable(),
    dueSoonDays: settingSchemas.dueSoonDays.nullable(),
    defaultMaxDwellDays: settingSchemas.defaultMaxDwellDays.nullable(),
    retentionDays: settingSchemas.retentionDays.nullable(),
    acknowledgeWithinMinutes: settingSchemas.acknowledgeWithinMinutes.nullable(),
    workingDayStart: settingSchemas.workingDayStart.nullable(),
    workingDayEnd: settingSchemas.workingDayEnd.nullable(),
    outOfHoursPhone: settingSchemas.outOfHoursPhone.nullable(),
    referralReminderHours: settingSchemas.referralReminderHours.nullable(),
    translationReviews: settingSchemas.translationReviews.nullable(),
    twocVoidWindowHours: settingSchemas.twocVoidWindowHours.nullable(),
    spareCatheters: settingSchemas.spareCatheters.nullable(),
  })
  .partial()
  .strict();
export type SettingsPatch = z.infer<typeof settingsPatchSchema>;

/** The settings form: every key sent; an empty box clears its setting; empty material boxes are left out. */
export const settingsFormSchema = settingsPatchSchema.omit({ translationReviews: true }).extend({
  defaultMaxDwellDays: z
    .partialRecord(z.enum(MATERIALS), days(1, 365).nullable())
    .transform((r) => Object.fromEntries(Object.entries(r).filter(([, v]) => v !== null && v !== undefined)) as Partial<Record<(typeof MATERIALS)[number], number>>),
});
export type SettingsFormValues = z.input<typeof settingsFormSchema>;
export type SettingsFormOutput = z.output<typeof settingsFormSchema>;

/** The translation review form: a name and a day per language, both empty when not reviewed. */
const blank = (v: unknown) => v === undefined || v === null || (typeof v === "string" && v.trim() === "");
export const translationReviewsFormSchema = z
  .object(
    Object.fromEntries(
      TRANSLATED_LOCALES.map((l) => [
        l,
        z.preprocess((v) => {
          const r = (v ?? {}) as { reviewerName?: unknown; reviewedOn?: unknown };
          return blank(r.reviewerName) && blank(r.reviewedOn) ? null : { reviewerName: r.reviewerName ?? "", reviewedOn: r.reviewedOn ?? "" };
        }, translationReviewSchema.nullable()),
      ]),
    ) as unknown as Record<TranslatedLocale, z.ZodType<TranslationReview | null, unknown>>,
  )
  .transform((r) => Object.fromEntries(Object.entries(r).filter(([, v]) => v !== null)) as Partial<Record<TranslatedLocale, TranslationReview>>);
export type TranslationReviewsFormValues = Record<TranslatedLocale, { reviewerName: string; reviewedOn: string }>;
