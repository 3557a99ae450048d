// A visit with NEWS2 observations: one schema for the react-hook-form form and the route
// handler. Bounds are lib/clinical's NEWS2_BOUNDS (a value outside is a typing error, not a
// reading). Error messages are keys (VisitForm.errors.<key>).
import { z } from "zod";
import { multiLine } from "./text";
import { NEWS2_BOUNDS } from "@/lib/clinical";
import type { RangeUnit } from "@/lib/shared/numbers";
import { pastInstant } from "./episode";
import { CONSCIOUSNESS_LEVELS, SITE_CONDITIONS, URINE_APPEARANCES } from "@/lib/clinical";
import { numberIn, requiredNumber, toNumber } from "./number";

const blank = (v: unknown) =>
  v === "" || v === null || (typeof v === "number" && Number.isNaN(v)) || (typeof v === "string" && v.trim() === "") ? undefined : v;
const measure = (bounds: { min: number; max: number }, whole: boolean, unit?: RangeUnit) => requiredNumber({ ...bounds, whole, unit });

export const observationsSchema = z.object({
  respirationRate: measure(NEWS2_BOUNDS.respirationRate, true, "per_min"),
  spo2: measure(NEWS2_BOUNDS.spo2, true, "percent"),
  spo2Scale: z.preprocess(toNumber, z.union([z.literal(1), z.literal(2)], { error: "choose_one" })),
  onOxygen: z.preprocess((v) => (v === "true" ? true : v === "false" ? false : v), z.boolean({ error: "choose_one" })),
  systolicBp: measure(NEWS2_BOUNDS.systolicBp, true, "mmhg"),
  pulse: measure(NEWS2_BOUNDS.pulse, true, "per_min"),
  consciousness: z.preprocess(blank, z.enum(CONSCIOUSNESS_LEVELS, { error: "choose_one" })),
  // The chart's resolution is 0.1 °C.
  temperatureC: z.preprocess(
    toNumber,
    numberIn({ ...NEWS2_BOUNDS.temperatureC, unit: "celsius" }).refine((n) => Math.abs(n * 10 - Math.round(n * 10)) < 1e-9, { error: "one_decimal" }),
  ),
});
export type ObservationsInput = z.infer<typeof observationsSchema>;

const yesNo = z.preprocess((v) => (v === "true" ? true : v === "false" ? false : blank(v)), z.boolean({ error: "choose_one" }));
const ticked = z.preprocess((v) => (v === "true" ? true : v === "false" || v === undefined ? false : v), z.boolean({ error: "choose_one" }));

/** "2026-12-10": a calendar day from today to a year ahead (the next visit). */
const nextDay = z.preprocess(
  blank,
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: "date" })
    .refine((s) => !Number.isNaN(Date.parse(`${s}T12:00:00Z`)) && new Date(`${s}T12:00:00Z`).toISOString().startsWith(s), { error: "date" })
    .refine((s) => Date.parse(`${s}T23:59:59Z`) >= Date.now() - 86_400_000, { error: "in_past" })
    .refine((s) => Date.parse(`${s}T00:00:00Z`) <= Date.now() + 366 * 86_400_000, { error: "too_late" })
    .optional(),
);

/** What the nurse found and did at a community visit: one screen, defaults from the last visit. */
export const visitFindingsSchema = z
  .object({
    draining: yesNo,
    bypassing: yesNo,
    urine: z.array(z.enum(URINE_APPEARANCES, { error: "choose_one" })).min(1, { error: "choose_one" }).max(URINE_APPEARANCES.length),
    site: z.preprocess(blank, z.enum(SITE_CONDITIONS, { error: "choose_one" })),
    bagChanged: ticked,
    valveChanged: ticked,
    catheterChanged: ticked,
    sampleSent: ticked,
    advice: z.preprocess(blank, multiLine(z.string().trim().max(1000, { error: "too_long" })).optional()),
    nextVisitOn: nextDay,
  })
  .strict();
export type VisitFindings = z.infer<typeof visitFindingsSchema>;

export const visitSchema = z.object({
  occurredAt: pastInstant,
  notes: z.preprocess(blank, multiLine(z.string({ error: "required" }).trim().max(2000, { error: "too_long" })).optional()),
  observations: observationsSchema.optional(),
  findings: visitFindingsSchema.optional(),
});
export type VisitInput = z.infer<typeof visitSchema>;
