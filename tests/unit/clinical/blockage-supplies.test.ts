import { describe, expect, it } from "vitest";
import {
  bagSchedule,
  blockagePattern,
  ClinicalInputError,
  nextBagChange,
  suppliesFor,
  supplyChangeInterval,
  type CatheterHistoryEntry,
} from "@/lib/clinical";

// The demo patient who blocks catheters about every three weeks.
const threeWeekly: CatheterHistoryEntry[] = [
  { insertedOn: "2025-01-01", removedOn: "2025-01-22", endReason: "blockage" },
  { insertedOn: "2025-01-22", removedOn: "2025-02-11", endReason: "blockage" },
  { insertedOn: "2025-02-11", removedOn: "2025-03-05", endReason: "blockage" },
  { insertedOn: "2025-03-05", removedOn: "2025-03-10", endReason: "expelled" },
  { insertedOn: "2025-03-10" },
];

describe("blockagePattern", () => {
  it("three-weekly blocker: typical life 21 days, planned change 18 days", () => {
    // common practice, no source: plan a few (3) days before the typical blockage
    expect(blockagePattern(threeWeekly)).toEqual({
      status: "pattern", blockageEpisodes: 3, typicalDwellDays: 21, shortestDwellDays: 20,
      longestDwellDays: 22, suggestedIntervalDays: 18, atFloor: false, source: "common-practice",
    });
  });

  it("fewer than three blockages is insufficient", () => {
    // common practice, no source
    expect(blockagePattern(threeWeekly.slice(1))).toEqual({ status: "insufficient", blockageEpisodes: 2, needed: 3 });
    expect(blockagePattern([])).toMatchObject({ status: "insufficient", blockageEpisodes: 0 });
  });

  it("median of an even count; floor of 7 days; cap at the maker's maximum", () => {
    // common practice, no source
    const quick = [6, 8, 9, 10].map((d) => ({ insertedOn: "2025-01-01", removedOn: `2025-01-${String(1 + d).padStart(2, "0")}`, endReason: "blockage" as const }));
    expect(blockagePattern(quick)).toMatchObject({ typicalDwellDays: 8.5, suggestedIntervalDays: 7, atFloor: true });
    const slow = [60, 70, 80].map((d) => ({ insertedOn: "2025-01-01", removedOn: new Date(Date.UTC(2025, 0, 1 + d)).toISOString().slice(0, 10), endReason: "blockage" as const }));
    expect(blockagePattern(slow, { maxDwellDays: 56 })).toMatchObject({ typicalDwellDays: 70, suggestedIntervalDays: 56 });
    expect(blockagePattern(slow, { marginDays: 10, minEpisodes: 2, floorDays: 14 })).toMatchObject({ suggestedIntervalDays: 60 });
  });

  it("bad history throws", () => {
    expect(() => blockagePattern("x" as never)).toThrow(ClinicalInputError);
    expect(() => blockagePattern([{ insertedOn: "2025-01-01", endReason: "blockage" }])).toThrow(/removedOn/);
    expect(() => blockagePattern([{ insertedOn: "2025-01-10", removedOn: "2025-01-01", endReason: "blockage" }])).toThrow(/before/);
  });
});

describe("suppliesFor", () => {
  it("28 days on a leg bag, 84-day catheter", () => {
    // Source: NHS patient pages (leg bags every 7 days, night bags single use); spares: common practice, no source
    const s = suppliesFor({ changeIntervalDays: 84 }, 28);
    expect(Object.fromEntries(s.lines.map((l) => [l.item, l.quantity]))).toEqual({
      catheter: 2, "leg-bag": 4, "night-bag": 28, gel: 2,
    });
  });

  it("three-weekly blocker on a valve for 90 days", () => {
    // Source: NHS patient pages (valves every 7 days); catheters per planned interval + spares: common practice, no source
    const s = suppliesFor({ changeIntervalDays: 18, legBag: false, valve: true, spareCatheters: 2 }, 90);
    expect(Object.fromEntries(s.lines.map((l) => [l.item, l.quantity]))).toEqual({
      catheter: 7, valve: 13, "night-bag": 90, gel: 7,
    });
    expect(s.lines.find((l) => l.item === "valve")).toMatchObject({ intervalDays: 7, source: "nhs-patient-catheter" });
  });

  it("no night bags or gel when not used; intervals can be overridden", () => {
    // makers say 5-7 days (NHS patient pages)
    const s = suppliesFor({ changeIntervalDays: 28, nightBag: false, gel: false, legBagChangeDays: 5 }, 30);
    expect(s.lines.map((l) => [l.item, l.quantity])).toEqual([["catheter", 3], ["leg-bag", 6]]);
  });

  it("bad input throws", () => {
    expect(() => suppliesFor(null as never, 28)).toThrow(ClinicalInputError);
    expect(() => suppliesFor({ changeIntervalDays: 0 }, 28)).toThrow(ClinicalInputError);
    expect(() => suppliesFor({ changeIntervalDays: 28 }, 2.5)).toThrow(/whole days/);
  });
});

describe("suppliesFor on the real next change day, and the blockage interval (worked examples)", () => {
  const catheters = (s: ReturnType<typeof suppliesFor>) => s.lines.find((l) => l.item === "catheter")!;
  it("84-day catheter changed 60 days ago (next change in 24 days), 28 days of supplies: one change + one spare = 2", () => {
    // common practice, no source: days 24 falls inside days 0–27; spare 1 (setting default)
    expect(catheters(suppliesFor({ changeIntervalDays: 84, firstChangeInDays: 24 }, 28)).quantity).toBe(2);
  });
  it("84-day catheter changed last week (next change in 77 days), 28 days: no change in the period, the spare only = 1", () => {
    // common practice, no source
    expect(catheters(suppliesFor({ changeIntervalDays: 84, firstChangeInDays: 77 }, 28)).quantity).toBe(1);
  });
  it("change due today (day 0), 28-day interval, 56 days: days 0 and 28 → 2 changes + 1 spare = 3; gel the same", () => {
    // common practice, no source
    const s = suppliesFor({ changeIntervalDays: 28, firstChangeInDays: 0 }, 56);
    expect(catheters(s).quantity).toBe(3);
    expect(s.lines.find((l) => l.item === "gel")!.quantity).toBe(3);
  });
  it("a change on the period's last day counts; one day later does not", () => {
    // common practice, no source: days 0–27 are the 28 days
    expect(catheters(suppliesFor({ changeIntervalDays: 84, firstChangeInDays: 27, spareCatheters: 0 }, 28)).quantity).toBe(1);
    expect(catheters(suppliesFor({ changeIntervalDays: 84, firstChangeInDays: 28, spareCatheters: 0 }, 28)).quantity).toBe(0);
  });
  it("a patient who blocks every three weeks: planned on the blockage interval, not 84 days", () => {
    // common practice, no source: blockagePattern suggests 18 days (typical dwell 21 − 3 margin)
    const interval = supplyChangeInterval(84, 18);
    expect(interval).toBe(18);
    // Next change in 5 days, 90 days: days 5, 23, 41, 59, 77 → 5 changes + 1 spare = 6.
    expect(catheters(suppliesFor({ changeIntervalDays: interval, firstChangeInDays: 5 }, 90)).quantity).toBe(6);
    // A blockage interval longer than the planned one never lengthens it; none known keeps it.
    expect(supplyChangeInterval(28, 40)).toBe(28);
    expect(supplyChangeInterval(84, null)).toBe(84);
  });
  it("refuses a first change that is not whole days or out of range", () => {
    expect(() => suppliesFor({ changeIntervalDays: 28, firstChangeInDays: 1.5 }, 28)).toThrow(ClinicalInputError);
    expect(() => suppliesFor({ changeIntervalDays: 28, firstChangeInDays: -1 }, 28)).toThrow(ClinicalInputError);
    expect(() => supplyChangeInterval(0)).toThrow(ClinicalInputError);
  });
});

describe("nextBagChange and bagSchedule", () => {
  it.each([
    ["2025-06-10", "ok", 2], // Source: NHS patient pages (leg bags every 7 days)
    ["2025-06-12", "due-today", 0],
    ["2025-06-14", "overdue", -2],
  ] as const)("leg bag changed 2025-06-05, today %s → %s", (today, state, daysUntil) => {
    expect(nextBagChange({ kind: "leg-bag", lastChangedOn: "2025-06-05" }, today)).toMatchObject({ nextOn: "2025-06-12", state, daysUntil });
  });

  it("valve every 7 days unless the maker says otherwise; soonest first", () => {
    // Source: NHS patient pages (valves every 7 days; makers 5-7)
    const s = bagSchedule(
      [
        { kind: "valve", lastChangedOn: "2025-06-05" },
        { kind: "leg-bag", lastChangedOn: "2025-06-05", intervalDays: 5 },
      ],
      "2025-06-06",
    );
    expect(s.map((b) => [b.kind, b.nextOn, b.source])).toEqual([
      ["leg-bag", "2025-06-10", "common-practice"],
      ["valve", "2025-06-12", "nhs-patient-catheter"],
    ]);
    expect(() => bagSchedule("x" as never)).toThrow(ClinicalInputError);
    expect(() => nextBagChange({ kind: "night-bag" as never, lastChangedOn: "2025-06-05" })).toThrow(ClinicalInputError);
  });
});
