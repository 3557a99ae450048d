// Calendar days in the deployment's time zone (the one next-intl formats with), so "today",
// "days since insertion" and diary days mean the same on the server as on the nurse's screen.
// (It is also the day a catheter went in, from which its expiry and planned dates count.)
export function deploymentTimeZone(): string {
  return process.env.CADDIS_TIME_ZONE ?? "Europe/London";
}

const dayFormatters = new Map<string, Intl.DateTimeFormat>();

/** The calendar date (YYYY-MM-DD) of an instant in a time zone. */
export function dayIn(instant: Date, timeZone = deploymentTimeZone()): string {
  let f = dayFormatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" });
    dayFormatters.set(timeZone, f);
  }
  return f.format(instant);
}

export function todayIso(timeZone = deploymentTimeZone(), now = new Date()): string {
  return dayIn(now, timeZone);
}

/** Minutes the zone is ahead of UTC at that instant (60 for London in summer). */
export function utcOffsetMinutes(instant: Date, timeZone = deploymentTimeZone()): number {
  const parts = new Intl.DateTimeFormat("en-US", {
    timeZone,
    hourCycle: "h23",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    second: "2-digit",
  }).formatToParts(instant);
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  const asUtc = Date.UTC(get("year"), get("month") - 1, get("day"), get("hour"), get("minute"), get("second"));
  return Math.round((asUtc - Math.floor(instant.getTime() / 1000) * 1000) / 60_000);
}

/** The last n calendar days ending today, newest first. */
export function lastDays(n: number, timeZone = deploymentTimeZone(), now = new Date()): string[] {
  const today = todayIso(timeZone, now);
  const base = Date.UTC(Number(today.slice(0, 4)), Number(today.slice(5, 7)) - 1, Number(today.slice(8, 10)));
  return Array.from({ length: n }, (_, i) => new Date(base - i * 86_400_000).toISOString().slice(0, 10));
}

/** Whole years from a YYYY-MM-DD birth date to a YYYY-MM-DD day. */
export function ageOn(dateOfBirth: string, day: string = todayIso()): number {
  const years = Number(day.slice(0, 4)) - Number(dateOfBirth.slice(0, 4));
  return day.slice(5) < dateOfBirth.slice(5) ? years - 1 : years;
}

