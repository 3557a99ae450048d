import { addDays as fnsAddDays, differenceInCalendarDays, format } from "date-fns";
import { describe, expect, it } from "vitest";
import { addDays, ClinicalInputError, planDates, toDayNumber, type Episode } from "@/lib/clinical";

const ep: Episode = { insertedOn: "2025-03-01", material: "all-silicone", route: "urethral" };

describe("planDates", () => {
  it.each<[Episode["material"], string, number]>([
    ["all-silicone", "2025-05-24", 84], // common practice, no source (12 weeks; journal citing RCN 2012 seen)
    ["hydrogel-coated-silicone", "2025-05-24", 84], // common practice, no source
    ["hydrogel-coated-latex", "2025-05-24", 84], // common practice, no source
    ["silicone-coated-latex", "2025-05-24", 84], // common practice, no source
    ["ptfe-coated-latex", "2025-03-29", 28], // common practice, no source (up to 28 days)
    ["latex", "2025-03-08", 7], // common practice, no source (short-term only; cautious)
  ])("material default: %s → change %s", (material, date, interval) => {
    const r = planDates({ ...ep, material }, { today: "2025-03-01" });
    expect(r.change).toMatchObject({ date, intervalDays: interval, basis: "material-default", source: "common-practice" });
  });

  it("the maker's maximum dwell wins over the material default", () => {
    // Source: journal citing RCN 2012 (up to 12 weeks per the maker)
    const r = planDates({ ...ep, maxDwellDays: 42 }, { today: "2025-03-01" });
    expect(r.change).toMatchObject({ date: "2025-04-12", basis: "maker", source: "rcn-2012-dwell" });
  });

  it("a shorter planned interval (blockage pattern) wins; a longer one does not", () => {
    // common practice, no source
    expect(planDates({ ...ep, plannedIntervalDays: 18 }, { today: "2025-03-01" }).change).toMatchObject({ date: "2025-03-19", basis: "planned-interval" });
    expect(planDates({ ...ep, plannedIntervalDays: 100 }, { today: "2025-03-01" }).change.basis).toBe("material-default");
  });

  it("review of need every 28 days by default, then at the change", () => {
    // Source: SIGN 160 (review need at every change and regularly); 28 days is common practice, no source
    const r = planDates(ep, { today: "2025-03-01" });
    expect(r.review).toMatchObject({ date: "2025-03-29", basis: "review-interval" });
    const late = planDates({ ...ep, lastReviewedOn: "2025-05-01" }, { today: "2025-05-02" });
    expect(late.review).toMatchObject({ date: "2025-05-24", basis: "at-change", source: "sign-160" });
  });

  it("review never falls after the change", () => {
    // Source: SIGN 160
    const r = planDates({ ...ep, material: "ptfe-coated-latex", reviewIntervalDays: 60 }, { today: "2025-03-01" });
    expect(r.review.date).toBe(r.change.date);
  });

  it.each([
    ["2025-05-16", "ok", 8], // common practice, no source: due-soon = within 7 days
    ["2025-05-17", "due-soon", 7],
    ["2025-05-24", "due-soon", 0],
    ["2025-05-25", "overdue", -1],
  ] as const)("today %s → change state %s", (today, state, daysUntil) => {
    const r = planDates({ ...ep, lastReviewedOn: "2025-05-10" }, { today });
    expect(r.change).toMatchObject({ state, daysUntil });
  });

  it("overall state is the worse of change and review", () => {
    const r = planDates(ep, { today: "2025-03-30" });
    expect(r.review.state).toBe("overdue");
    expect(r.change.state).toBe("ok");
    expect(r.state).toBe("overdue");
  });

  it("a removed catheter is not due anything", () => {
    const r = planDates({ ...ep, removedOn: "2025-04-01" }, { today: "2025-09-01" });
    expect(r).toMatchObject({ active: false, state: "ok" });
  });

  it("deployment options override the defaults", () => {
    const r = planDates(ep, {
      today: "2025-03-01", defaultMaxDwellDays: { "all-silicone": 56 }, reviewIntervalDays: 14, dueSoonDays: 3,
    });
    expect(r.change.date).toBe("2025-04-26");
    expect(r.review.date).toBe("2025-03-15");
    expect(planDates(ep, { today: "2025-05-20", dueSoonDays: 3 }).change.state).toBe("ok");
  });

  it("dates cross DST changes and leap days like date-fns", () => {
    // Cross-check of calendar arithmetic against date-fns
    for (const start of ["2024-02-28", "2024-03-30", "2024-10-26", "2023-12-31"]) {
      for (const n of [1, 7, 28, 84]) {
        const [y, m, d] = start.split("-").map(Number);
        expect(addDays(start, n)).toBe(format(fnsAddDays(new Date(y, m - 1, d), n), "yyyy-MM-dd"));
      }
    }
    expect(differenceInCalendarDays(new Date(2025, 4, 24), new Date(2025, 2, 1))).toBe(84);
  });

  it("today as a Date uses its local calendar day", () => {
    expect(toDayNumber("today", new Date(2025, 2, 1, 23, 59))).toBe(toDayNumber("today", "2025-03-01"));
    expect(() => toDayNumber("today", new Date("nonsense"))).toThrow(ClinicalInputError);
    expect(planDates(ep).active).toBe(true);
  });

  it.each<[string, Partial<Episode>]>([
    ["insertedOn", { insertedOn: "2025-02-29" }],
    ["insertedOn", { insertedOn: undefined as never }],
    ["material", { material: "steel" as never }],
    ["route", { route: undefined as never }],
    ["maxDwellDays", { maxDwellDays: 0 }],
    ["removedOn", { removedOn: "tomorrow" }],
  ])("bad %s throws", (field, change) => {
    try {
      planDates({ ...ep, ...change }, { today: "2025-03-01" });
      expect.unreachable();
    } catch (e) {
      expect((e as ClinicalInputError).field).toBe(field);
    }
  });
});
