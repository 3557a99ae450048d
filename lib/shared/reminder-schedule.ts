// When a chosen reminder is due: each of its times on each day (weekly ones on their day), in the
// deployment's time zone; a time inside the person's quiet hours waits to their end. Pure, so the
// scheduler (lib/portal/reminders.ts) and the tests share it.
import { utcOffsetMinutes } from "./time-zone";

export type ScheduleChoice = { on: boolean; times: string[]; day?: number };
export type Occurrence = { /** The chosen day and time, for the key: "2026-12-03T08:30". */ slot: string; dueAt: Date };

const minutesOf = (hhmm: string) => Number(hhmm.slice(0, 2)) * 60 + Number(hhmm.slice(3, 5));

/** Whether a time of day (minutes) falls in quiet hours; start = end means none, start > end spans midnight. */
export function inQuietHours(minutes: number, quietStart: string, quietEnd: string): boolean {
  const s = minutesOf(quietStart);
  const e = minutesOf(quietEnd);
  if (s === e) return false;
  return s < e ? minutes >= s && minutes < e : minutes >= s || minutes < e;
}

/** The instant a local date and time of day is in the zone (the later one in an autumn overlap is fine). */
export function zonedInstant(day: string, hhmm: string, timeZone: string): Date {
  const naive = Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10)), 0, minutesOf(hhmm));
  const first = naive - utcOffsetMinutes(new Date(naive), timeZone) * 60_000;
  return new Date(naive - utcOffsetMinutes(new Date(first), timeZone) * 60_000);
}

function addDay(day: string, n: number): string {
  const d = new Date(Date.UTC(Number(day.slice(0, 4)), Number(day.slice(5, 7)) - 1, Number(day.slice(8, 10))) + n * 86_400_000);
  return d.toISOString().slice(0, 10);
}

const weekday = (day: string) => new Date(`${day}T12:00:00Z`).getUTCDay();

/**
 * The occurrences due in (now − windowMinutes, now]: each chosen time on the days around now
 * (only `day` for a weekly reminder), moved to the end of quiet hours when it falls in them.
 */
export function dueOccurrences({
  choice,
  weekly,
  quietStart,
  quietEnd,
  now,
  timeZone,
  windowMinutes = 60,
  today,
}: {
  choice: ScheduleChoice;
  weekly: boolean;
  quietStart: string;
  quietEnd: string;
  now: Date;
  timeZone: string;
  windowMinutes?: number;
  /** The local date of now (YYYY-MM-DD). */
  today: string;
}): Occurrence[] {
  if (!choice.on) return [];
  const out: Occurrence[] = [];
  // Yesterday too: a 23:00 reminder held by quiet hours comes due this morning.
  for (const day of [addDay(today, -1), today]) {
    if (weekly && weekday(day) !== (choice.day ?? 1)) continue;
    for (const time of [...new Set(choice.times)]) {
      let dueAt = zonedInstant(day, time, timeZone);
      if (inQuietHours(minutesOf(time), quietStart, quietEnd)) {
        // To the next end of quiet hours: the same day if it is still ahead, else the next.
        const endToday = zonedInstant(day, quietEnd, timeZone);
        dueAt = endToday > dueAt ? endToday : zonedInstant(addDay(day, 1), quietEnd, timeZone);
      }
      if (dueAt <= now && dueAt.getTime() > now.getTime() - windowMinutes * 60_000) out.push({ slot: `${day}T${time}`, dueAt });
    }
  }
  return out;
}
