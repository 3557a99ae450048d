// Numbers as people type them: plain decimals only, with a point or a comma ("1.5", "1,5"),
// never "1e3", "0x10", "Infinity" or " 12 ml". Used by every numeric field's schema (forms and
// API alike) and by the screens that read a typed number themselves.
export const PLAIN_DECIMAL = /^[+-]?\d+([.,]\d+)?$/;

/** A typed number, or undefined when the text is not a plain decimal. */
export function parsePlainDecimal(text: string): number | undefined {
  const s = text.trim();
  return PLAIN_DECIMAL.test(s) ? Number(s.replace(",", ".")) : undefined;
}

/** Units a range message may name (Errors.units.<unit>). */
export const RANGE_UNITS = ["ml", "ch", "kg", "days", "hours", "celsius", "mmhg", "percent", "per_min", "items", "minutes"] as const;
export type RangeUnit = (typeof RANGE_UNITS)[number];

/** The error code of a value outside [min, max]: "range:5:30:ml"; the screens say "between 5 and 30 ml". */
export function rangeCode(min: number, max: number, unit?: RangeUnit): string {
  return `range:${min}:${max}${unit ? `:${unit}` : ""}`;
}

export function parseRangeCode(code: unknown): { min: number; max: number; unit?: RangeUnit } | null {
  if (typeof code !== "string") return null;
  const m = /^range:(-?[\d.]+):(-?[\d.]+)(?::(\w+))?$/.exec(code);
  if (!m) return null;
  const unit = (RANGE_UNITS as readonly string[]).includes(m[3] ?? "") ? (m[3] as RangeUnit) : undefined;
  return { min: Number(m[1]), max: Number(m[2]), unit };
}
