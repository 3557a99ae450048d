// One way to read a number in every schema: a JSON number, or a string that is a plain decimal
// (lib/shared/numbers.ts). Codes: "number" (not a number at all), "whole_number", and a range
// code that names the allowed range ("range:5:30:ml").
import { z } from "zod";
import { parsePlainDecimal, rangeCode, type RangeUnit } from "@/lib/shared/numbers";

const blank = (v: unknown) =>
  v === undefined || v === null || v === "" || (typeof v === "number" && Number.isNaN(v)) || (typeof v === "string" && v.trim() === "");

/** Form text → number; anything else is passed on for the schema to refuse. Blank → undefined. */
export function toNumber(v: unknown): unknown {
  if (blank(v)) return undefined;
  if (typeof v === "string") return parsePlainDecimal(v) ?? v;
  return v;
}

type Options = { min: number; max: number; unit?: RangeUnit; whole?: boolean; missing?: string };

/** The number schema itself (no blank handling): finite, whole when asked, within [min, max]. */
export function numberIn({ min, max, unit, whole = false, missing = "required" }: Options) {
  const range = rangeCode(min, max, unit);
  const base = z.number({ error: (i) => (i.input === undefined ? missing : "number") }).refine(Number.isFinite, { error: "number" });
  return (whole ? base.refine(Number.isInteger, { error: "whole_number", abort: true }) : base)
    .refine((n) => n >= min && n <= max, { error: range });
}

export const requiredNumber = (o: Options) => z.preprocess(toNumber, numberIn(o));
export const optionalNumber = (o: Options) => z.preprocess(toNumber, numberIn(o).optional());
/** For query strings (paging): digits only, whole. */
export const queryInt = (min: number, max: number, fallback: number) =>
  z.preprocess((v) => (blank(v) ? undefined : toNumber(v)), numberIn({ min, max, whole: true }).default(fallback));
