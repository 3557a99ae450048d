import { z } from "zod";
import { singleLine } from "./text";
import { MATERIALS } from "@/lib/clinical";
import { numberIn, toNumber } from "./number";

// Deployment settings (the `settings` table, key → JSON value). Messages are codes that the
// settings form translates (AdminSettings.errors.<code>).

/** Digits only: what a patient dials (999, 112, 911, 000…). */
export const emergencyNumberSchema = z.string().trim().regex(/^[0-9]{2,6}$/, { message: "emergency_digits" });

const days = (min: number, max: number) => z.preprocess(toNumber, numberIn({ min, max, unit: "days", whole: true, missing: "whole_days" }));

/** ISO 3166 two-letter region whose conventions dates and numbers follow (GB: 3 December, 24-hour). */
export const regionSchema = z.string().trim().toUpperCase().regex(/^[A-Z]{2}$/, { message: "region_code" });

export const settingSchemas = {
  emergencyNumber: emergencyNumberSchema,
  region: regionSchema,
  outOfHoursServiceName: singleLine(z.string().trim().min(2, { message: "name_length" }).max(120, { message: "name_length" })),
  reviewIntervalDays: days(1, 365),
  dueSoonDays: days(0, 60),
  defaultMaxDwellDays: z.partialRecord(z.enum(MATERIALS), days(1, 365)),
  retentionDays: days(30, 100 * 365),
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
