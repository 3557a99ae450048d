import { ClinicalInputError } from "./errors";

/**
 * Calendar dates are plain 'YYYY-MM-DD' strings with no time zone: a catheter
 * inserted "on 3 March" was inserted on 3 March wherever the record is read.
 * Internally they become day numbers (days since 1970-01-01) computed with
 * Date.UTC, so daylight-saving changes never shift a date.
 *
 * A `today` given as a JS Date means the local calendar date of that Date in the
 * runtime's time zone (the browser's, or the server's). Servers that act for a
 * patient in another zone should pass today as a 'YYYY-MM-DD' string instead.
 */
export type DateInput = Date | string;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const MS_PER_DAY = 86_400_000;

export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

export function daysInMonth(year: number, month: number): number {
  return [31, isLeapYear(year) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1];
}

/** True when year/month/day name a real calendar date. */
export function isRealDate(year: number, month: number, day: number): boolean {
  return (
    Number.isInteger(year) && Number.isInteger(month) && Number.isInteger(day) &&
    month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(year, month)
  );
}

export function formatIsoDate(year: number, month: number, day: number): string {
  return `${String(year).padStart(4, "0")}-${String(month).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
}

/** 'YYYY-MM-DD' → day number; throws ClinicalInputError for anything else or an impossible date. */
export function parseIsoDate(field: string, value: unknown): number {
  if (value === undefined || value === null || value === "") {
    throw new ClinicalInputError(field, "missing", "a date is required");
  }
  const m = typeof value === "string" ? ISO_DATE.exec(value) : null;
  if (!m) throw new ClinicalInputError(field, "invalid", "must be a date as YYYY-MM-DD");
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (!isRealDate(y, mo, d)) throw new ClinicalInputError(field, "invalid", "is not a real calendar date");
  return Date.UTC(y, mo - 1, d) / MS_PER_DAY;
}

export function dayNumberToIso(dayNumber: number): string {
  const dt = new Date(dayNumber * MS_PER_DAY);
  return formatIsoDate(dt.getUTCFullYear(), dt.getUTCMonth() + 1, dt.getUTCDate());
}

/** Day number of `today`: a 'YYYY-MM-DD' string, or the local calendar date of a Date (default: now). */
export function toDayNumber(field: string, today: DateInput | undefined): number {
  if (today === undefined) today = new Date();
  if (today instanceof Date) {
    if (Number.isNaN(today.getTime())) throw new ClinicalInputError(field, "invalid", "is not a valid date");
    return Date.UTC(today.getFullYear(), today.getMonth(), today.getDate()) / MS_PER_DAY;
  }
  return parseIsoDate(field, today);
}

export function addDays(iso: string, days: number): string {
  return dayNumberToIso(parseIsoDate("date", iso) + days);
}
