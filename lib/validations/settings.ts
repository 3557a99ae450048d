import { z } from "zod";
import { singleLine } from "./text";
import { MATERIALS } from "@/lib/clinical";
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

export const settingSchemas = {
  emergencyNumber: emergencyNumberSchema,
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
  // Hours after a removal for a trial without catheter by which the patient should have passed urine.
  twocVoidWindowHours: z.preprocess(toNumber, numberIn({ min: 1, max: 24, unit: "hours", whole: true })),
} as const;

export type SettingKey = keyof typeof settingSchemas;
export const settingKeys = Object.keys(settingSchemas) as SettingKey[];

/** A change: each key set to a value, or null to clear it. Unknown keys are refused. */
export const settingsPatchSchema = z
  .object({
    emergencyNumber: settingSchemas.emergencyNumber.nullable(),
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
    twocVoidWindowHours: settingSchemas.twocVoidWindowHours.nullable(),
  })
  .partial()
  .strict();
export type SettingsPatch = z.infer<typeof settingsPatchSchema>;

/** The settings form: every key sent; an empty box clears its setting; empty material boxes are left out. */
export const settingsFormSchema = settingsPatchSchema.extend({
  defaultMaxDwellDays: z
    .partialRecord(z.enum(MATERIALS), days(1, 365).nullable())
    .transform((r) => Object.fromEntries(Object.entries(r).filter(([, v]) => v !== null && v !== undefined)) as Partial<Record<(typeof MATERIALS)[number], number>>),
});
export type SettingsFormValues = z.input<typeof settingsFormSchema>;
export type SettingsFormOutput = z.output<typeof settingsFormSchema>;
