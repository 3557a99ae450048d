// Working time for the acknowledgement deadline: 2 hours of the working day (default Monday to
// Friday 08:00–18:00, common practice, no source), in the deployment's zone.
import { describe, expect, it } from "vitest";
import { addWorkingMinutes, DEFAULT_WORKING_HOURS, minutesOfClock } from "@/lib/shared/working-hours";

const zone = "Europe/London";
const at = (iso: string) => new Date(iso);

describe("addWorkingMinutes", () => {
  it("adds plain minutes inside the working day", () => {
    // Wednesday 3 December 2025, 10:00 GMT.
    expect(addWorkingMinutes(at("2025-12-03T10:00:00Z"), 120, DEFAULT_WORKING_HOURS, zone).toISOString()).toBe("2025-12-03T12:00:00.000Z");
  });
  it("carries what is left past the end of the day to the next working morning, over a weekend", () => {
    // Friday 5 December 2025 17:30 → 30 min on Friday, 90 min on Monday 8 December → 09:30.
    expect(addWorkingMinutes(at("2025-12-05T17:30:00Z"), 120, DEFAULT_WORKING_HOURS, zone).toISOString()).toBe("2025-12-08T09:30:00.000Z");
  });
  it("starts counting at the start of the day when raised at night", () => {
    expect(addWorkingMinutes(at("2025-12-03T02:15:00Z"), 120, DEFAULT_WORKING_HOURS, zone).toISOString()).toBe("2025-12-03T10:00:00.000Z");
  });
  it("follows the zone's clock in summer time", () => {
    // Wednesday 2 July 2025, 17:00 BST (16:00Z): 60 min today, 60 tomorrow from 08:00 BST (07:00Z).
    expect(addWorkingMinutes(at("2025-07-02T16:00:00Z"), 120, DEFAULT_WORKING_HOURS, zone).toISOString()).toBe("2025-07-03T08:00:00.000Z");
  });
  it("across the spring clock change", () => {
    // Friday 28 March 2025 17:00 GMT; the clocks go forward on Sunday 30 March; Monday 08:00 BST = 07:00Z.
    expect(addWorkingMinutes(at("2025-03-28T17:00:00Z"), 120, DEFAULT_WORKING_HOURS, zone).toISOString()).toBe("2025-03-31T08:00:00.000Z");
  });
  it("refuses hours that never open", () => {
    expect(() => addWorkingMinutes(at("2025-12-03T10:00:00Z"), 60, { start: 600, end: 600, days: [1] }, zone)).toThrow();
  });
});

describe("minutesOfClock", () => {
  it("reads HH:MM and refuses anything else", () => {
    expect(minutesOfClock("08:30")).toBe(510);
    expect(minutesOfClock("23:59")).toBe(1439);
    expect(minutesOfClock("24:00")).toBeNull();
    expect(minutesOfClock("8:30")).toBeNull();
  });
});
