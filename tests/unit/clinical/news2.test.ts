import { describe, expect, it } from "vitest";
import { ClinicalInputError, scoreNews2, type News2Observations } from "@/lib/clinical";

// All-zero baseline: every value sits in the chart's 0 band.
const base: News2Observations = {
  respirationRate: 16, spo2: 97, spo2Scale: 1, onOxygen: false,
  systolicBp: 120, pulse: 70, consciousness: "A", temperatureC: 37.0,
};

describe("scoreNews2 parameter bands", () => {
  it.each([
    [8, 3], // Source: RCP NEWS2 (2017), chart 1
    [9, 1], // Source: RCP NEWS2 (2017), chart 1
    [11, 1], // Source: RCP NEWS2 (2017), chart 1
    [12, 0], // Source: RCP NEWS2 (2017), chart 1
    [20, 0], // Source: RCP NEWS2 (2017), chart 1
    [21, 2], // Source: RCP NEWS2 (2017), chart 1
    [24, 2], // Source: RCP NEWS2 (2017), chart 1
    [25, 3], // Source: RCP NEWS2 (2017), chart 1
  ])("respiration rate %i scores %i", (rr, score) => {
    expect(scoreNews2({ ...base, respirationRate: rr }).subscores.respirationRate).toBe(score);
  });

  it.each([
    [91, 3], // Source: RCP NEWS2 (2017), chart 1
    [92, 2], // Source: RCP NEWS2 (2017), chart 1
    [93, 2], // Source: RCP NEWS2 (2017), chart 1
    [94, 1], // Source: RCP NEWS2 (2017), chart 1
    [96, 0], // Source: RCP NEWS2 (2017), chart 1
  ])("SpO2 scale 1 %i%% scores %i", (spo2, score) => {
    expect(scoreNews2({ ...base, spo2 }).subscores.spo2).toBe(score);
  });

  it.each([
    [83, false, 3], // Source: RCP NEWS2 (2017), chart 1
    [84, false, 2], // Source: RCP NEWS2 (2017), chart 1
    [86, false, 1], // Source: RCP NEWS2 (2017), chart 1
    [88, false, 0], // Source: RCP NEWS2 (2017), chart 1
    [92, false, 0], // Source: RCP NEWS2 (2017), chart 1
    [93, false, 0], // Source: RCP NEWS2 (2017), chart 1 (93 or more on air scores 0)
    [100, false, 0], // Source: RCP NEWS2 (2017), chart 1
    [92, true, 0], // Source: RCP NEWS2 (2017), chart 1
    [93, true, 1], // Source: RCP NEWS2 (2017), chart 1
    [95, true, 2], // Source: RCP NEWS2 (2017), chart 1
    [97, true, 3], // Source: RCP NEWS2 (2017), chart 1
  ])("SpO2 scale 2 %i%% (oxygen %s) scores %i", (spo2, onOxygen, score) => {
    expect(scoreNews2({ ...base, spo2Scale: 2, spo2, onOxygen }).subscores.spo2).toBe(score);
  });

  it.each([
    [90, 3], // Source: RCP NEWS2 (2017), chart 1
    [91, 2], // Source: RCP NEWS2 (2017), chart 1
    [101, 1], // Source: RCP NEWS2 (2017), chart 1
    [111, 0], // Source: RCP NEWS2 (2017), chart 1
    [219, 0], // Source: RCP NEWS2 (2017), chart 1
    [220, 3], // Source: RCP NEWS2 (2017), chart 1
  ])("systolic BP %i scores %i", (systolicBp, score) => {
    expect(scoreNews2({ ...base, systolicBp }).subscores.systolicBp).toBe(score);
  });

  it.each([
    [40, 3], // Source: RCP NEWS2 (2017), chart 1
    [41, 1], // Source: RCP NEWS2 (2017), chart 1
    [51, 0], // Source: RCP NEWS2 (2017), chart 1
    [90, 0], // Source: RCP NEWS2 (2017), chart 1
    [91, 1], // Source: RCP NEWS2 (2017), chart 1
    [111, 2], // Source: RCP NEWS2 (2017), chart 1
    [131, 3], // Source: RCP NEWS2 (2017), chart 1
  ])("pulse %i scores %i", (pulse, score) => {
    expect(scoreNews2({ ...base, pulse }).subscores.pulse).toBe(score);
  });

  it.each([
    [35.0, 3], // Source: RCP NEWS2 (2017), chart 1
    [35.1, 1], // Source: RCP NEWS2 (2017), chart 1
    [36.0, 1], // Source: RCP NEWS2 (2017), chart 1
    [36.1, 0], // Source: RCP NEWS2 (2017), chart 1
    [37.5, 0], // Source: RCP NEWS2 (2017), chart 1 (a public worked example wrongly scores 1)
    [38.0, 0], // Source: RCP NEWS2 (2017), chart 1
    [38.1, 1], // Source: RCP NEWS2 (2017), chart 1
    [39.0, 1], // Source: RCP NEWS2 (2017), chart 1
    [39.1, 2], // Source: RCP NEWS2 (2017), chart 1
  ])("temperature %d °C scores %i", (temperatureC, score) => {
    expect(scoreNews2({ ...base, temperatureC }).subscores.temperature).toBe(score);
  });

  it.each([
    ["A", 0], // Source: RCP NEWS2 (2017), chart 1
    ["C", 3], // Source: RCP NEWS2 (2017), chart 1 (new confusion)
    ["V", 3], // Source: RCP NEWS2 (2017), chart 1
    ["P", 3], // Source: RCP NEWS2 (2017), chart 1
    ["U", 3], // Source: RCP NEWS2 (2017), chart 1
  ] as const)("consciousness %s scores %i", (consciousness, score) => {
    expect(scoreNews2({ ...base, consciousness }).subscores.consciousness).toBe(score);
  });

  it("oxygen scores 2, air 0", () => {
    // Source: RCP NEWS2 (2017), chart 1
    expect(scoreNews2({ ...base, onOxygen: true }).subscores.air).toBe(2);
    expect(scoreNews2(base).subscores.air).toBe(0);
  });

  it("a value between chart steps takes the more cautious neighbour", () => {
    // common practice, no source: when in doubt, the higher score
    expect(scoreNews2({ ...base, pulse: 90.5 }).subscores.pulse).toBe(1);
    expect(scoreNews2({ ...base, temperatureC: 38.05 }).subscores.temperature).toBe(1);
    expect(scoreNews2({ ...base, respirationRate: 11.5 }).subscores.respirationRate).toBe(1);
  });
});

describe("scoreNews2 totals, risk and response", () => {
  it("all-normal observations total 0, low risk, routine response", () => {
    // Source: RCP NEWS2 (2017), chart 4 (0 → at least 12-hourly)
    const r = scoreNews2(base);
    expect(r).toMatchObject({ total: 0, risk: "low", response: { key: "routine" } });
    expect(r.response.monitoring).toMatch(/12 hours/);
  });

  it("total 1-4 without a single 3 → low, ward assessment", () => {
    // Source: RCP NEWS2 (2017), chart 4 (1-4 → 4-6 hourly, registered nurse assesses)
    const r = scoreNews2({ ...base, pulse: 95, temperatureC: 38.5 });
    expect(r).toMatchObject({ total: 2, risk: "low", response: { key: "ward-assessment" } });
  });

  it("a single 3 with total 0-4 → low-medium, urgent ward review", () => {
    // Source: RCP NEWS2 (2017), chart 4; risk label from memory (chart 3)
    const r = scoreNews2({ ...base, consciousness: "C" });
    expect(r).toMatchObject({ total: 3, risk: "low-medium", response: { key: "urgent-ward-review" } });
  });

  it("total 5-6 → medium, urgent response", () => {
    // Source: RCP NEWS2 (2017), chart 4 (5 or more → urgent response)
    const r = scoreNews2({ ...base, respirationRate: 22, pulse: 115, temperatureC: 38.5 });
    expect(r).toMatchObject({ total: 5, risk: "medium", response: { key: "urgent" } });
  });

  it("total 6 with a single 3 stays medium", () => {
    // Source: RCP NEWS2 (2017), chart 4
    const r = scoreNews2({ ...base, systolicBp: 88, pulse: 115, temperatureC: 38.5 });
    expect(r).toMatchObject({ total: 6, risk: "medium" });
  });

  it("total 7 or more → high, emergency response", () => {
    // Source: RCP NEWS2 (2017), chart 4 (7 or more → emergency response, continuous monitoring)
    const r = scoreNews2({ ...base, respirationRate: 26, spo2: 93, onOxygen: true, pulse: 120 });
    expect(r.total).toBe(3 + 2 + 2 + 2);
    expect(r).toMatchObject({ risk: "high", response: { key: "emergency", monitoring: "continuous" } });
  });

  it("maximum total is 20", () => {
    // Source: RCP NEWS2 (2017), chart 1 (total 0-20)
    const r = scoreNews2({
      respirationRate: 30, spo2: 80, spo2Scale: 1, onOxygen: true, systolicBp: 80,
      pulse: 140, consciousness: "U", temperatureC: 34,
    });
    expect(r.total).toBe(20);
  });
});

describe("scoreNews2 refuses bad input rather than scoring it", () => {
  it.each([
    ["respirationRate", -1],
    ["respirationRate", 81],
    ["spo2", 101],
    ["spo2", 19],
    ["systolicBp", 30],
    ["pulse", 350],
    ["temperatureC", 24.9],
    ["temperatureC", 45.1],
    ["temperatureC", Number.NaN],
    ["pulse", undefined],
    ["spo2Scale", 3],
    ["onOxygen", "yes"],
    ["consciousness", "X"],
    ["systolicBp", "120"],
  ])("%s = %s throws ClinicalInputError naming the field", (field, value) => {
    // common practice, no source: plausibility bounds chosen by Caddis
    const obs = { ...base, [field]: value } as unknown as News2Observations;
    expect(() => scoreNews2(obs)).toThrow(ClinicalInputError);
    try {
      scoreNews2(obs);
    } catch (e) {
      expect((e as ClinicalInputError).field).toBe(field);
    }
  });

  it("missing observations throw", () => {
    expect(() => scoreNews2(undefined as unknown as News2Observations)).toThrow(ClinicalInputError);
  });
});
