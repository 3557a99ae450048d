import { describe, expect, it } from "vitest";
import { TWOC_DEFAULTS, trialClock } from "@/lib/clinical";

const removedAt = new Date("2026-12-03T08:00:00Z");

describe("trialClock", () => {
  it("expects a void within 6 hours by default", () => {
    // common practice, no source (NHS trusts' TWOC leaflets: a void within about 4–6 hours)
    expect(TWOC_DEFAULTS.voidWindowHours.value).toBe(6);
    const c = trialClock(removedAt, new Date("2026-12-03T10:30:00Z"));
    expect(c.voidBy.toISOString()).toBe("2026-12-03T14:00:00.000Z");
    expect(c.minutesLeft).toBe(210);
    expect(c.overdue).toBe(false);
  });
  it("is overdue once the window has passed (at the very minute)", () => {
    expect(trialClock(removedAt, new Date("2026-12-03T14:00:00Z")).overdue).toBe(true);
    const late = trialClock(removedAt, new Date("2026-12-03T15:10:00Z"));
    expect(late).toMatchObject({ overdue: true, minutesLeft: 0 });
  });
  it("takes the deployment's window in hours", () => {
    // common practice, no source: a 4-hour window
    const c = trialClock(removedAt, new Date("2026-12-03T11:59:30Z"), 4);
    expect(c.voidBy.toISOString()).toBe("2026-12-03T12:00:00.000Z");
    expect(c.minutesLeft).toBe(1);
    expect(() => trialClock(removedAt, removedAt, 0)).toThrow(RangeError);
  });
});
