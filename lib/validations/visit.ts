// A visit with NEWS2 observations: one schema for the react-hook-form form and the route
// handler. Bounds are lib/clinical's NEWS2_BOUNDS (a value outside is a typing error, not a
// reading). Error messages are keys (VisitForm.errors.<key>).
import { z } from "zod";
import { multiLine, singleLine } from "./text";
import { NEWS2_BOUNDS } from "@/lib/clinical";
import type { RangeUnit } from "@/lib/shared/numbers";
import { pastInstant } from "./episode";
import { numberIn, requiredNumber, toNumber } from "./number";

const blank = (v: unknown) =>
  v === "" || v === null || (typeof v === "number" && Number.isNaN(v)) || (typeof v === "string" && v.trim() === "") ? undefined : v;
const measure = (bounds: { min: number; max: number }, whole: boolean, unit?: RangeUnit) => requiredNumber({ ...bounds, whole, unit });

export const CONSCIOUSNESS = ["A", "C", "V", "P", "U"] as const;

export const observationsSchema = z.object({
  respirationRate: measure(NEWS2_BOUNDS.respirationRate, true, "per_min"),
  spo2: measure(NEWS2_BOUNDS.spo2, true, "percent"),
  spo2Scale: z.preprocess(toNumber, z.union([z.literal(1), z.literal(2)], { error: "choose_one" })),
  onOxygen: z.preprocess((v) => (v === "true" ? true : v === "false" ? false : v), z.boolean({ error: "choose_one" })),
  systolicBp: measure(NEWS2_BOUNDS.systolicBp, true, "mmhg"),
  pulse: measure(NEWS2_BOUNDS.pulse, true, "per_min"),
  consciousness: z.preprocess(blank, z.enum(CONSCIOUSNESS, { error: "choose_one" })),
  // The chart's resolution is 0.1 °C.
  temperatureC: z.preprocess(
    toNumber,
    numberIn({ ...NEWS2_BOUNDS.temperatureC, unit: "celsius" }).refine((n) => Math.abs(n * 10 - Math.round(n * 10)) < 1e-9, { error: "one_decimal" }),
  ),
});
export type ObservationsInput = z.infer<typeof observationsSchema>;

export const visitSchema = z.object({
  occurredAt: pastInstant,
  notes: z.preprocess(blank, multiLine(z.string({ error: "required" }).trim().max(2000, { error: "too_long" })).optional()),
  observations: observationsSchema.optional(),
});
export type VisitInput = z.infer<typeof visitSchema>;
