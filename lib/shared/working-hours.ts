// Time counted only within working hours: an alert acknowledged "within 2 hours" means two hours
// of the team's working day, so one raised at 17:30 on a Friday is due at 09:30 on Monday.
import { deploymentTimeZone } from "./time-zone";

export type WorkingHours = {
  /** Minutes after local midnight the working day starts and ends (08:00 → 480). */
  start: number;
  end: number;
  /** ISO weekdays worked (1 Monday … 7 Sunday). */
  days: readonly number[];
};

/** Monday to Friday, 08:00 to 18:00 (common practice, no source): the settings can change the hours. */
export const DEFAULT_WORKING_HOURS: WorkingHours = { start: 8 * 60, end: 18 * 60, days: [1, 2, 3, 4, 5] };

const WEEKDAYS: Record<string, number> = { Mon: 1, Tue: 2, Wed: 3, Thu: 4, Fri: 5, Sat: 6, Sun: 7 };
const formatters = new Map<string, Intl.DateTimeFormat>();

function localParts(instant: Date, timeZone: string) {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", weekday: "short", hour: "2-digit", minute: "2-digit", second: "2-digit" });
    formatters.set(timeZone, f);
  }
  const parts = Object.fromEntries(f.formatToParts(instant).map((p) => [p.type, p.value]));
  const minuteOfDay = Number(parts.hour) * 60 + Number(parts.minute) + (Number(parts.second) + instant.getUTCMilliseconds() / 1000) / 60;
  return { weekday: WEEKDAYS[parts.weekday!] ?? 1, minuteOfDay };
}

/** "08:30" → 510; null when it is not a time of day. */
export function minutesOfClock(text: string): number | null {
  const m = /^([01]\d|2[0-3]):([0-5]\d)$/.exec(text);
  return m ? Number(m[1]) * 60 + Number(m[2]) : null;
}

/**
 * The instant `minutes` of working time after `from`. Time outside the hours does not count;
 * a day change across a clock change is read again from the zone, so it lands right.
 */
export function addWorkingMinutes(from: Date, minutes: number, hours: WorkingHours = DEFAULT_WORKING_HOURS, timeZone = deploymentTimeZone()): Date {
  if (hours.end <= hours.start || hours.days.length === 0) throw new Error("working hours: the day must end after it starts, on at least one weekday");
  let t = from.getTime();
  let left = minutes;
  // Each pass either skips to the next working period or spends time in one: a few weeks at most.
  for (let guard = 0; guard < 400; guard++) {
    const { weekday, minuteOfDay } = localParts(new Date(t), timeZone);
    if (!hours.days.includes(weekday) || minuteOfDay >= hours.end) {
      t += (24 * 60 - minuteOfDay) * 60_000;
      continue;
    }
    if (minuteOfDay < hours.start) {
      t += (hours.start - minuteOfDay) * 60_000;
      continue;
    }
    if (left <= 0) return new Date(t);
    const take = Math.min(left, hours.end - minuteOfDay);
    t += take * 60_000;
    left -= take;
    if (left <= 0) return new Date(t);
  }
  throw new Error("working hours: no working time found");
}
