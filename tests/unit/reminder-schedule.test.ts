// When a chosen reminder comes due: its times in the deployment's zone, weekly ones on their day,
// and a time inside quiet hours held to their end (common practice, no source: the person's own
// choice of hours).
import { describe, expect, it } from "vitest";
import { dueOccurrences, inQuietHours, zonedInstant } from "@/lib/shared/reminder-schedule";

const tz = "Europe/London";
const at = (iso: string) => new Date(iso);

describe("reminder schedule", () => {
  it("reads a local time in the zone, summer and winter", () => {
    expect(zonedInstant("2026-07-01", "08:30", tz).toISOString()).toBe("2026-07-01T07:30:00.000Z");
    expect(zonedInstant("2026-12-03", "08:30", tz).toISOString()).toBe("2026-12-03T08:30:00.000Z");
  });

  it("knows quiet hours across midnight and within a day", () => {
    expect(inQuietHours(23 * 60, "22:00", "07:00")).toBe(true);
    expect(inQuietHours(6 * 60 + 59, "22:00", "07:00")).toBe(true);
    expect(inQuietHours(7 * 60, "22:00", "07:00")).toBe(false);
    expect(inQuietHours(13 * 60, "13:00", "14:00")).toBe(true);
    expect(inQuietHours(13 * 60, "13:00", "13:00")).toBe(false);
  });

  it("is due at its time and for the window after, not before", () => {
    const choice = { on: true, times: ["08:30"] };
    const base = { choice, weekly: false, quietStart: "22:00", quietEnd: "07:00", timeZone: tz, today: "2026-12-03" };
    expect(dueOccurrences({ ...base, now: at("2026-12-03T08:29:00Z") })).toEqual([]);
    expect(dueOccurrences({ ...base, now: at("2026-12-03T08:30:00Z") })).toEqual([{ slot: "2026-12-03T08:30", dueAt: at("2026-12-03T08:30:00Z") }]);
    expect(dueOccurrences({ ...base, now: at("2026-12-03T09:31:00Z") })).toEqual([]);
    expect(dueOccurrences({ ...base, choice: { ...choice, on: false }, now: at("2026-12-03T08:30:00Z") })).toEqual([]);
  });

  it("a time inside quiet hours waits to their end (the next morning for a late evening one)", () => {
    const base = { weekly: false, quietStart: "22:00", quietEnd: "07:00", timeZone: tz };
    const late = { ...base, choice: { on: true, times: ["23:00"] } };
    expect(dueOccurrences({ ...late, today: "2026-12-03", now: at("2026-12-03T23:00:00Z") })).toEqual([]);
    expect(dueOccurrences({ ...late, today: "2026-12-04", now: at("2026-12-04T07:05:00Z") })).toEqual([{ slot: "2026-12-03T23:00", dueAt: at("2026-12-04T07:00:00Z") }]);
    const early = { ...base, choice: { on: true, times: ["06:00"] } };
    expect(dueOccurrences({ ...early, today: "2026-12-04", now: at("2026-12-04T06:00:00Z") })).toEqual([]);
    expect(dueOccurrences({ ...early, today: "2026-12-04", now: at("2026-12-04T07:00:00Z") })).toEqual([{ slot: "2026-12-04T06:00", dueAt: at("2026-12-04T07:00:00Z") }]);
  });

  it("a weekly reminder comes only on its day", () => {
    // 2026-12-03 is a Thursday (4).
    const base = { choice: { on: true, times: ["10:00"], day: 4 }, weekly: true, quietStart: "22:00", quietEnd: "07:00", timeZone: tz };
    expect(dueOccurrences({ ...base, today: "2026-12-03", now: at("2026-12-03T10:10:00Z") })).toHaveLength(1);
    expect(dueOccurrences({ ...base, choice: { ...base.choice, day: 5 }, today: "2026-12-03", now: at("2026-12-03T10:10:00Z") })).toEqual([]);
  });
});
