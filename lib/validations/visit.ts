// A visit with NEWS2 observations: one schema for the react-hook-form form and the route
// handler. Bounds are lib/clinical's NEWS2_BOUNDS (a value outside is a typing error, not a
// reading). Error messages are keys (VisitForm.errors.<key>).
import { z } from "zod";
import { NEWS2_BOUNDS } from "@/lib/clinical";
import { pastInstant } from "./episode";
import { CONSCIOUSNESS_LEVELS } from "@/lib/clinical";

const blank = (v: unknown) =>
  v === "" || v === null || (typeof v === "number" && Number.isNaN(v)) || (typeof v === "string" && v.trim() === "") ? undefined : v;
const numberFrom = (v: unknown) => {
  const b = blank(v);
  return typeof b === "string" && /^-?\d+([.,]\d+)?$/.test(b.trim()) ? Number(b.trim().replace(",", ".")) : b;
};
const measure = (bounds: { min: number; max: number }, whole: boolean) =>
  z.preprocess(
    numberFrom,
    (whole ? z.number({ error: "required" }).int({ error: "whole_number" }) : z.number({ error: "required" }))
      .min(bounds.min, { error: "out_of_range" })
      .max(bounds.max, { error: "out_of_range" }),
  );


export const observationsSchema = z.object({
  respirationRate: measure(NEWS2_BOUNDS.respirationRate, true),
  spo2: measure(NEWS2_BOUNDS.spo2, true),
  spo2Scale: z.preprocess(numberFrom, z.union([z.literal(1), z.literal(2)], { error: "choose_one" })),
  onOxygen: z.preprocess((v) => (v === "true" ? true : v === "false" ? false : v), z.boolean({ error: "choose_one" })),
  systolicBp: measure(NEWS2_BOUNDS.systolicBp, true),
  pulse: measure(NEWS2_BOUNDS.pulse, true),
  consciousness: z.preprocess(blank, z.enum(CONSCIOUSNESS_LEVELS, { error: "choose_one" })),
  // The chart's resolution is 0.1 °C.
  temperatureC: z.preprocess(
    numberFrom,
    z
      .number({ error: "required" })
      .min(NEWS2_BOUNDS.temperatureC.min, { error: "out_of_range" })
      .max(NEWS2_BOUNDS.temperatureC.max, { error: "out_of_range" })
      .refine((n) => Math.abs(n * 10 - Math.round(n * 10)) < 1e-9, { error: "out_of_range" }),
  ),
});
export type ObservationsInput = z.infer<typeof observationsSchema>;

export const visitSchema = z.object({
  occurredAt: pastInstant,
  notes: z.preprocess(blank, z.string({ error: "required" }).trim().max(2000, { error: "too_long" }).optional()),
  observations: observationsSchema.optional(),
});
export type VisitInput = z.infer<typeof visitSchema>;
