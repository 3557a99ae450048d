// A trial without catheter (TWOC) under way: when the patient is expected to have passed urine,
// and whether that time has gone by with no outcome recorded. The window is a deployment
// setting; its default is a rule of thumb (NHS trusts' TWOC leaflets expect a void within about
// 4–6 hours of removal; no guideline sets it).
import type { SourceId } from "./sources";

export const TWOC_DEFAULTS = {
  voidWindowHours: { value: 6, source: "common-practice" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

export type TrialClock = {
  /** When the patient is expected to have passed urine. */
  voidBy: Date;
  /** Whole minutes left before `voidBy` (0 once it has passed). */
  minutesLeft: number;
  /** The window has passed and no outcome is recorded. */
  overdue: boolean;
};

/** The clock of a trial started at `removedAt`, with the window in hours (setting, else the default). */
export function trialClock(removedAt: Date, now: Date, windowHours: number = TWOC_DEFAULTS.voidWindowHours.value): TrialClock {
  if (!(windowHours > 0)) throw new RangeError("windowHours must be above 0");
  const voidBy = new Date(removedAt.getTime() + windowHours * 3_600_000);
  const left = voidBy.getTime() - now.getTime();
  return { voidBy, minutesLeft: Math.max(0, Math.ceil(left / 60_000)), overdue: left <= 0 };
}
