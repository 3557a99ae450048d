import { describe, expect, it } from "vitest";
import { ClinicalInputError, fluidBalance, kdigoUrineOutputStage, urineOutputRate, type DiaryEntry } from "@/lib/clinical";

const NOW = "2025-06-15T12:00:00Z";
/** Hourly urine of `mlPerHour`, from `hours` before NOW up to NOW. */
function hourly(mlPerHour: number, hours: number): DiaryEntry[] {
  const end = Date.parse(NOW);
  return Array.from({ length: hours }, (_, i) => ({
    kind: "out" as const,
    volumeMl: mlPerHour,
    at: new Date(end - i * 3_600_000).toISOString(),
  }));
}
const diaryStart: DiaryEntry = { kind: "in", volumeMl: 200, at: "2025-06-13T00:00:00Z" };

describe("urineOutputRate and KDIGO", () => {
  it("70 kg, 30 ml/h for 6 h → 0.43 ml/kg/h, low, stage 1", () => {
    // Source: KDIGO AKI (2012) table 2 (< 0.5 ml/kg/h for 6-12 h; for 70 kg < 35 ml/h for 6 h)
    const r = urineOutputRate([diaryStart, ...hourly(30, 6)], 70, 6, NOW);
    expect(r.mlPerKgPerHour).toBeCloseTo(30 / 70, 6);
    expect(r).toMatchObject({ totalOutMl: 180, low: true, kdigoStage: 1, ng51Risk: "high", diaryCoversWindow: true });
  });

  it("70 kg, 35 ml/h for 6 h is exactly 0.5: not low", () => {
    // Source: KDIGO AKI (2012) table 2 (strictly below 0.5)
    const r = urineOutputRate([diaryStart, ...hourly(35, 6)], 70, 6, NOW);
    expect(r).toMatchObject({ low: false, kdigoStage: 0, ng51Risk: "moderate-to-high" });
  });

  it("below 0.5 for 12 h → stage 2", () => {
    // Source: KDIGO AKI (2012) table 2
    expect(urineOutputRate([diaryStart, ...hourly(30, 12)], 70, 12, NOW).kdigoStage).toBe(2);
  });

  it("below 0.3 for 24 h → stage 3; no urine for 12 h → stage 3", () => {
    // Source: KDIGO AKI (2012) table 2
    expect(urineOutputRate([diaryStart, ...hourly(20, 24)], 70, 24, NOW).kdigoStage).toBe(3);
    expect(urineOutputRate([diaryStart], 70, 12, NOW)).toMatchObject({ kdigoStage: 3, totalOutMl: 0 });
  });

  it("0.5-1 ml/kg/h is NG51 moderate-to-high; above 1 is none", () => {
    // Source: NICE NG51 (catheterised 0.5-1 ml/kg/h moderate-to-high, < 0.5 high)
    expect(urineOutputRate(hourly(60, 6), 70, 6, NOW).ng51Risk).toBe("moderate-to-high");
    expect(urineOutputRate(hourly(80, 6), 70, 6, NOW).ng51Risk).toBeNull();
  });

  it("a window shorter than 6 h never flags low", () => {
    // Source: KDIGO AKI (2012) table 2 (criteria need at least 6 h)
    expect(urineOutputRate(hourly(0, 4), 70, 4, NOW)).toMatchObject({ low: false, kdigoStage: 0, ng51Risk: null });
  });

  it("entries outside the window do not count; a diary started late is flagged", () => {
    const r = urineOutputRate(hourly(50, 10), 70, 6, NOW);
    expect(r.totalOutMl).toBe(300);
    expect(urineOutputRate(hourly(50, 3), 70, 6, NOW).diaryCoversWindow).toBe(false);
  });

  it("kdigoUrineOutputStage takes the worst of 6, 12 and 24 h", () => {
    // Source: KDIGO AKI (2012) table 2: good output earlier, none in the last 12 h
    const early = hourly(100, 24).filter((e) => Date.parse(e.at as string) <= Date.parse(NOW) - 12 * 3_600_000);
    const r = kdigoUrineOutputStage([diaryStart, ...early], 70, NOW);
    expect(r.stage).toBe(3);
    expect(r.windows.map((w) => w.kdigoStage)).toEqual([1, 3, 0]);
  });

  it.each([
    ["weightKg", () => urineOutputRate([], 0, 6, NOW)],
    ["windowHours", () => urineOutputRate([], 70, 0, NOW)],
    ["now", () => urineOutputRate([], 70, 6, "2025-06-15")],
    ["entries[0].volumeMl", () => urineOutputRate([{ kind: "out", volumeMl: -5, at: NOW }], 70, 6, NOW)],
    ["entries[0].kind", () => urineOutputRate([{ kind: "drip" as never, volumeMl: 5, at: NOW }], 70, 6, NOW)],
    ["entries[0].at", () => urineOutputRate([{ kind: "out", volumeMl: 5, at: new Date("x") }], 70, 6, NOW)],
    ["entries[0].at", () => urineOutputRate([{ kind: "out", volumeMl: 5, at: "" }], 70, 6, NOW)],
    ["entries[0].at", () => urineOutputRate([{ kind: "out", volumeMl: 5, at: "2025-13-45T99:99" }], 70, 6, NOW)],
    ["entries", () => urineOutputRate("x" as never, 70, 6, NOW)],
  ])("bad %s throws", (field, fn) => {
    try {
      fn();
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ClinicalInputError);
      expect((e as ClinicalInputError).field).toBe(field);
    }
  });
});

describe("fluidBalance", () => {
  const entries: DiaryEntry[] = [
    { kind: "in", volumeMl: 250, at: "2025-06-14T23:30:00Z" }, // 00:30 on the 15th at UTC+1
    { kind: "in", volumeMl: 300, at: "2025-06-15T08:00:00Z" },
    { kind: "out", volumeMl: 400, at: "2025-06-15T09:00:00Z" },
    { kind: "out", volumeMl: 350, at: new Date("2025-06-15T22:30:00Z") }, // 23:30 on the 15th at UTC+1
    { kind: "in", volumeMl: 200, at: "2025-06-15T23:30:00Z" }, // 00:30 on the 16th at UTC+1
  ];

  it("sums one local day at a fixed offset", () => {
    expect(fluidBalance(entries, "2025-06-15", { utcOffsetMinutes: 60 })).toEqual({
      day: "2025-06-15", inMl: 550, outMl: 750, balanceMl: -200, inCount: 2, outCount: 2,
    });
    expect(fluidBalance(entries, "2025-06-15", { utcOffsetMinutes: 0 })).toMatchObject({ inMl: 500, outMl: 750 });
  });

  it("without an offset uses the runtime's local day", () => {
    const local = [{ kind: "in" as const, volumeMl: 100, at: new Date(2025, 5, 15, 0, 5) }, { kind: "in" as const, volumeMl: 100, at: new Date(2025, 5, 15, 23, 55) }];
    expect(fluidBalance(local, "2025-06-15")).toMatchObject({ inMl: 200, inCount: 2 });
  });

  it("refuses a bad day, offset or volume", () => {
    expect(() => fluidBalance(entries, "15/06/2025")).toThrow(ClinicalInputError);
    expect(() => fluidBalance(entries, "2025-06-15", { utcOffsetMinutes: 2000 })).toThrow(ClinicalInputError);
    expect(() => fluidBalance([{ kind: "in", volumeMl: 6000, at: NOW }], "2025-06-15")).toThrow(ClinicalInputError);
  });
});
