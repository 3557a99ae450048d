import { formatIsoDate, parseIsoDate } from "./dates";
import { ClinicalInputError, optionalNumber, requireNumber, requireOneOf } from "./errors";
import type { SourceId } from "./sources";

/**
 * Time zones: `at` is an instant, a Date or an ISO 8601 date-time string. A string should
 * carry "Z" or an offset; without one JavaScript reads it as the runtime's local time.
 * Date-only strings are refused (JavaScript would read them as UTC midnight).
 * A `day` is a local calendar date 'YYYY-MM-DD': by default local to the runtime (the
 * patient's browser); pass `utcOffsetMinutes` (e.g. 60 for UTC+1) to fix the zone on a server.
 */
export interface DiaryEntry {
  kind: "in" | "out";
  volumeMl: number;
  at: Date | string;
}

export interface FluidBalanceOptions {
  utcOffsetMinutes?: number;
}

export interface FluidBalance {
  day: string;
  inMl: number;
  outMl: number;
  /** in − out */
  balanceMl: number;
  inCount: number;
  outCount: number;
}

/** A single drink or bag emptying above this is a typing error. */
export const MAX_ENTRY_ML = 5000;
const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;

function instant(field: string, at: unknown): number {
  if (at instanceof Date) {
    if (Number.isNaN(at.getTime())) throw new ClinicalInputError(field, "invalid", "is not a valid date-time");
    return at.getTime();
  }
  if (typeof at !== "string" || at === "") throw new ClinicalInputError(field, "missing", "a date-time is required");
  if (!ISO_DATE_TIME.test(at)) throw new ClinicalInputError(field, "invalid", "must be an ISO date-time (YYYY-MM-DDTHH:mm…)");
  const ms = Date.parse(at);
  if (Number.isNaN(ms)) throw new ClinicalInputError(field, "invalid", "is not a valid date-time");
  return ms;
}

function checkEntries(entries: readonly DiaryEntry[]): { kind: "in" | "out"; volumeMl: number; ms: number }[] {
  if (!Array.isArray(entries)) throw new ClinicalInputError("entries", "missing", "entries must be a list");
  return entries.map((e, i) => ({
    kind: requireOneOf(`entries[${i}].kind`, e?.kind, ["in", "out"] as const),
    volumeMl: requireNumber(`entries[${i}].volumeMl`, e.volumeMl, 0, MAX_ENTRY_ML),
    ms: instant(`entries[${i}].at`, e.at),
  }));
}

function localDay(ms: number, offsetMinutes: number | undefined): string {
  if (offsetMinutes === undefined) {
    const d = new Date(ms);
    return formatIsoDate(d.getFullYear(), d.getMonth() + 1, d.getDate());
  }
  const d = new Date(ms + offsetMinutes * 60_000);
  return formatIsoDate(d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate());
}

/**
 * Drinks in and urine out on one local calendar day (see the time-zone note above).
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function fluidBalance(entries: readonly DiaryEntry[], day: string, options: FluidBalanceOptions = {}): FluidBalance {
  parseIsoDate("day", day);
  const offset = optionalNumber("utcOffsetMinutes", options.utcOffsetMinutes, -14 * 60, 14 * 60);
  const result: FluidBalance = { day, inMl: 0, outMl: 0, balanceMl: 0, inCount: 0, outCount: 0 };
  for (const e of checkEntries(entries)) {
    if (localDay(e.ms, offset) !== day) continue;
    if (e.kind === "in") {
      result.inMl += e.volumeMl;
      result.inCount++;
    } else {
      result.outMl += e.volumeMl;
      result.outCount++;
    }
  }
  result.balanceMl = result.inMl - result.outMl;
  return result;
}

/** KDIGO 2012 table 2 urine-output criteria, and the NICE NG51 catheterised-urine criterion. */
export const URINE_OUTPUT_RULES = {
  kdigoLowMlPerKgPerH: { value: 0.5, source: "kdigo-aki-2012-table2" },
  kdigoStage1MinHours: { value: 6, source: "kdigo-aki-2012-table2" },
  kdigoStage2MinHours: { value: 12, source: "kdigo-aki-2012-table2" },
  kdigoStage3MlPerKgPerH: { value: 0.3, source: "kdigo-aki-2012-table2" },
  kdigoStage3MinHours: { value: 24, source: "kdigo-aki-2012-table2" },
  kdigoAnuriaHours: { value: 12, source: "kdigo-aki-2012-table2" },
  ng51HighBelow: { value: 0.5, source: "nice-ng51" },
  ng51ModerateUpTo: { value: 1, source: "nice-ng51" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

export type KdigoStage = 0 | 1 | 2 | 3;

export interface UrineOutputRate {
  mlPerKgPerHour: number;
  totalOutMl: number;
  windowHours: number;
  weightKg: number;
  windowStart: string;
  windowEnd: string;
  /** Below 0.5 ml/kg/h over a window of at least 6 hours (KDIGO). */
  low: boolean;
  /** 0 = no urine-output criterion met over this window. */
  kdigoStage: KdigoStage;
  /** NG51 sepsis criterion for a catheterised adult, over a window of at least 6 hours. */
  ng51Risk: "high" | "moderate-to-high" | null;
  /** False when the first diary entry is after the window start: output may be under-counted. */
  diaryCoversWindow: boolean;
  source: SourceId;
}

/**
 * Urine output in ml/kg/h over the `windowHours` before `now` (entries at or before
 * `now` and after the window start), with KDIGO staging on that window: stage 1 < 0.5
 * for ≥ 6 h; stage 2 < 0.5 for ≥ 12 h; stage 3 < 0.3 for ≥ 24 h or no urine for ≥ 12 h.
 * A bag emptied late makes output look low: the result depends on a complete diary.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function urineOutputRate(
  entries: readonly DiaryEntry[],
  weightKg: number,
  windowHours: number,
  now: Date | string = new Date(),
): UrineOutputRate {
  const weight = requireNumber("weightKg", weightKg, 2, 400);
  const hours = requireNumber("windowHours", windowHours, 1, 168);
  const end = instant("now", now);
  const start = end - hours * 3_600_000;
  const checked = checkEntries(entries);
  let total = 0;
  for (const e of checked) if (e.kind === "out" && e.ms > start && e.ms <= end) total += e.volumeMl;
  const rate = total / weight / hours;
  const R = URINE_OUTPUT_RULES;

  let stage: KdigoStage = 0;
  if (hours >= R.kdigoStage3MinHours.value && rate < R.kdigoStage3MlPerKgPerH.value) stage = 3;
  else if (hours >= R.kdigoAnuriaHours.value && total === 0) stage = 3;
  else if (hours >= R.kdigoStage2MinHours.value && rate < R.kdigoLowMlPerKgPerH.value) stage = 2;
  else if (hours >= R.kdigoStage1MinHours.value && rate < R.kdigoLowMlPerKgPerH.value) stage = 1;

  const longEnough = hours >= R.kdigoStage1MinHours.value;
  const ng51Risk = !longEnough
    ? null
    : rate < R.ng51HighBelow.value
      ? "high"
      : rate <= R.ng51ModerateUpTo.value
        ? "moderate-to-high"
        : null;
  const first = checked.reduce((min, e) => Math.min(min, e.ms), Infinity);

  return {
    mlPerKgPerHour: rate,
    totalOutMl: total,
    windowHours: hours,
    weightKg: weight,
    windowStart: new Date(start).toISOString(),
    windowEnd: new Date(end).toISOString(),
    low: longEnough && rate < R.kdigoLowMlPerKgPerH.value,
    kdigoStage: stage,
    ng51Risk,
    diaryCoversWindow: first <= start,
    source: "kdigo-aki-2012-table2",
  };
}

/**
 * The highest KDIGO urine-output stage over the 6, 12 and 24 hours before `now`.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function kdigoUrineOutputStage(entries: readonly DiaryEntry[], weightKg: number, now: Date | string = new Date()): {
  stage: KdigoStage;
  windows: UrineOutputRate[];
} {
  const windows = [6, 12, 24].map((h) => urineOutputRate(entries, weightKg, h, now));
  const stage = windows.reduce<KdigoStage>((max, w) => (w.kdigoStage > max ? w.kdigoStage : max), 0);
  return { stage, windows };
}
