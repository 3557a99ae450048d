import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  ClinicalInputError,
  compareTriageLevels,
  TRIAGE_RULES,
  triageCheckIn,
  type CheckInAnswers,
  type TriageLevel,
} from "@/lib/clinical";

const ok: CheckInAnswers = { draining: "yes", pain: "none" };

describe("triageCheckIn levels", () => {
  it.each<[string, Partial<CheckInAnswers>, TriageLevel, string?]>([
    // common practice, no source: nothing wrong
    ["all well", {}, "self-care"],
    // Source: NICE NG113 1.1.1 and IDSA 2010 (cloudy or smelly urine alone is not CA-UTI); NICE QS90 statement 2
    ["cloudy or smelly urine alone", { cloudyOrSmelly: true }, "self-care", "TRIAGE-CLOUDY-OR-SMELLY"],
    // common practice, no source
    ["sediment alone", { sediment: true }, "self-care", "TRIAGE-SEDIMENT"],
    // Source: NICE NG51 (objective new altered mental state: high risk); IDSA 2010 (altered mental status)
    ["new confusion", { newConfusion: true }, "emergency", "TRIAGE-NEW-CONFUSION"],
    // Source: NICE NG51 (raised respiratory rate: breathlessness as the patient's proxy)
    ["breathless", { breathless: true }, "emergency", "TRIAGE-BREATHLESS"],
    // common practice, no source
    ["feels very unwell", { feelsVeryUnwell: true }, "emergency", "TRIAGE-VERY-UNWELL"],
    // Source: IDSA 2010 (fever, rigors); NICE NG51
    ["shivering with 38.5 °C", { shivering: true, temperatureC: 38.5 }, "emergency", "TRIAGE-RIGORS-TEMPERATURE"],
    // Source: NICE NG51 (tympanic < 36 °C) and IDSA 2010 (rigors)
    ["shivering with 35.5 °C", { shivering: true, temperatureC: 35.5 }, "emergency", "TRIAGE-RIGORS-TEMPERATURE"],
    // Source: IDSA 2010 (rigors are a CA-UTI symptom); temperature unknown → urgent, common practice
    ["shivering, temperature not taken", { shivering: true }, "urgent", "TRIAGE-SHIVERING"],
    // Source: IDSA 2010 (new or worse fever)
    ["fever 38.0 °C", { temperatureC: 38.0 }, "urgent", "TRIAGE-FEVER"],
    ["37.9 °C", { temperatureC: 37.9 }, "self-care"],
    // Source: NICE NG51 (tympanic < 36 °C: moderate-to-high risk)
    ["35.9 °C", { temperatureC: 35.9 }, "urgent", "TRIAGE-LOW-TEMPERATURE"],
    ["36.0 °C", { temperatureC: 36.0 }, "self-care"],
    // common practice, no source: blocked catheter
    ["not draining, no pain", { draining: "none" }, "urgent", "TRIAGE-NO-DRAINAGE"],
    ["not draining, with pain", { draining: "none", pain: "mild" }, "urgent", "TRIAGE-NO-DRAINAGE-PAIN"],
    // Source: NICE NG51 (no urine for 12-18 h: moderate-to-high risk)
    ["no urine 12 h", { draining: "none", hoursWithoutUrine: 12 }, "urgent", "TRIAGE-NO-URINE-12H"],
    // Source: NICE NG51 (no urine for 18 h: high risk)
    ["no urine 18 h", { draining: "none", hoursWithoutUrine: 18 }, "emergency", "TRIAGE-NO-URINE-18H"],
    // common practice, no source
    ["draining less", { draining: "less" }, "soon", "TRIAGE-LESS-DRAINAGE"],
    ["draining less with bad pain", { draining: "less", pain: "severe" }, "urgent", "TRIAGE-LESS-DRAINAGE-SEVERE-PAIN"],
    // Source: IDSA 2010 (flank pain, pelvic discomfort)
    ["bad pain", { pain: "severe" }, "urgent", "TRIAGE-SEVERE-PAIN"],
    // common practice, no source
    ["some pain", { pain: "mild" }, "soon", "TRIAGE-MILD-PAIN"],
    // Source: IDSA 2010 (acute haematuria); clots can block the catheter: common practice
    ["red urine", { blood: "red" }, "urgent", "TRIAGE-BLOOD-RED-OR-CLOTS"],
    ["clots", { blood: "clots" }, "urgent", "TRIAGE-BLOOD-RED-OR-CLOTS"],
    // common practice, no source
    ["pink urine", { blood: "pink" }, "soon", "TRIAGE-BLOOD-PINK"],
    ["no blood", { blood: "none" }, "self-care"],
    // common practice, no source: the suprapubic tract closes quickly
    ["suprapubic catheter out", { catheterOut: true, route: "suprapubic" }, "urgent", "TRIAGE-CATHETER-OUT-SUPRAPUBIC"],
    // common practice, no source
    ["urethral catheter out", { catheterOut: true, route: "urethral" }, "urgent", "TRIAGE-CATHETER-OUT"],
    ["catheter out, route not given", { catheterOut: true }, "urgent", "TRIAGE-CATHETER-OUT"],
    // Source: lib/clinical/sources.ts constipation-blockage (constipation presses on the bladder: blockage, bypassing, spasm)
    ["leaking (bypassing)", { leaking: true }, "soon", "TRIAGE-LEAKING"],
    ["constipated", { constipated: true }, "soon", "TRIAGE-CONSTIPATED"],
    // Source: NICE NG51 (signs of wound infection: moderate-to-high when sepsis is suspected); alone: soon
    ["red suprapubic site", { suprapubicSiteRed: true }, "soon", "TRIAGE-SUPRAPUBIC-SITE-RED"],
    // Source: IDSA 2010 (cloudy urine alone does not mean CA-UTI; fever does)
    ["cloudy urine with fever", { cloudyOrSmelly: true, temperatureC: 38.4 }, "urgent", "TRIAGE-FEVER"],
  ])("%s → %s", (_name, extra, level, ruleId) => {
    const r = triageCheckIn({ ...ok, ...extra });
    expect(r.level).toBe(level);
    if (ruleId) expect(r.ruleIds).toContain(ruleId);
    else expect(r.ruleIds).toEqual([]);
  });

  it("cloudy urine alone advises no antibiotics and no dipstick", () => {
    // Source: NICE NG113 1.1.1; NICE QS90 statement 2
    const keys = triageCheckIn({ ...ok, cloudyOrSmelly: true }).advice.map((a) => a.key);
    expect(keys).toEqual(expect.arrayContaining(["self-care", "no-antibiotics", "no-dipstick", "drink", "if-worse"]));
  });

  it("the level's main step comes first and reasons are most serious first", () => {
    const r = triageCheckIn({ draining: "less", pain: "mild", newConfusion: true, cloudyOrSmelly: true });
    expect(r.advice[0].key).toBe("call-emergency");
    expect(r.reasons[0]).toMatchObject({ key: "new-confusion", level: "emergency" });
    expect(r.reasons.at(-1)?.level).toBe("self-care");
    expect(r.sources).toContain("nice-ng51");
    expect(new Set(r.advice.map((a) => a.key)).size).toBe(r.advice.length);
  });

  it("all-well self-care still advises drinking and when to get help", () => {
    expect(triageCheckIn(ok).advice.map((a) => a.key)).toEqual(["self-care", "drink", "if-worse"]);
  });

  it("every rule has a unique id, a source and short plain text", () => {
    const ids = TRIAGE_RULES.map((r) => r.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const r of TRIAGE_RULES) {
      expect(r.source).toBeTruthy();
      // Plain language: short sentences, short words (reading grade ≤ 6 is the target).
      for (const sentence of r.reason.text.split(/[.!?]\s*/).filter(Boolean)) {
        expect(sentence.split(/\s+/).length).toBeLessThanOrEqual(12);
      }
      expect(r.reason.text).toMatch(/\b[Yy]our?\b|No urine|Less urine/);
    }
  });

  it.each<[string, unknown]>([
    ["draining", { pain: "none" }],
    ["pain", { draining: "yes" }],
    ["draining", { draining: "maybe", pain: "none" }],
    ["temperatureC", { ...ok, temperatureC: 50 }],
    ["hoursWithoutUrine", { ...ok, hoursWithoutUrine: -1 }],
    ["blood", { ...ok, blood: "brown" }],
    ["shivering", { ...ok, shivering: "yes" }],
    ["route", { ...ok, route: "nasal" }],
    ["answers", null],
  ])("bad %s throws", (field, answers) => {
    try {
      triageCheckIn(answers as CheckInAnswers);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ClinicalInputError);
      expect((e as ClinicalInputError).field).toBe(field);
    }
  });
});

// ---- properties -------------------------------------------------------------

const BOOLEANS = [
  "shivering", "newConfusion", "feelsVeryUnwell", "breathless", "leaking",
  "catheterOut", "cloudyOrSmelly", "sediment", "constipated", "suprapubicSiteRed",
] as const;

const answersArb: fc.Arbitrary<CheckInAnswers> = fc.record(
  {
    draining: fc.constantFrom("yes", "less", "none"),
    pain: fc.constantFrom("none", "mild", "severe"),
    hoursWithoutUrine: fc.integer({ min: 0, max: 48 }),
    temperatureC: fc.integer({ min: 340, max: 410 }).map((t) => t / 10),
    blood: fc.constantFrom("none", "pink", "red", "clots"),
    route: fc.constantFrom("urethral", "suprapubic"),
    ...Object.fromEntries(BOOLEANS.map((b) => [b, fc.boolean()])),
  } as Record<keyof CheckInAnswers, fc.Arbitrary<unknown>>,
  { requiredKeys: ["draining", "pain"] },
) as fc.Arbitrary<CheckInAnswers>;

function next<T>(order: readonly T[], v: T | undefined, fallback: T, steps: number): T {
  const i = order.indexOf(v ?? fallback);
  return order[Math.min(order.length - 1, i + steps)];
}

/** Make one answer worse (or add a symptom). */
function worsen(a: CheckInAnswers, field: string, steps: number): CheckInAnswers {
  const w: CheckInAnswers = { ...a };
  switch (field) {
    case "draining": w.draining = next(["yes", "less", "none"], a.draining, "yes", steps); break;
    case "pain": w.pain = next(["none", "mild", "severe"], a.pain, "none", steps); break;
    case "blood": w.blood = next(["none", "pink", "red", "clots"], a.blood, "none", steps); break;
    case "hoursWithoutUrine": w.hoursWithoutUrine = (a.hoursWithoutUrine ?? 0) + steps * 3; break;
    case "temperatureC": {
      // Further from normal; a temperature newly taken may be anything.
      if (a.temperatureC === undefined) w.temperatureC = 34 + steps * 1.3;
      else w.temperatureC = Math.min(45, Math.max(25, a.temperatureC + (a.temperatureC >= 37 ? 0.4 : -0.4) * steps));
      break;
    }
    default: (w as unknown as Record<string, unknown>)[field] = true;
  }
  return w;
}

describe("triageCheckIn properties", () => {
  const fields = ["draining", "pain", "blood", "hoursWithoutUrine", "temperatureC", ...BOOLEANS];

  it("making any answer worse never lowers the level", () => {
    fc.assert(
      fc.property(answersArb, fc.constantFrom(...fields), fc.integer({ min: 1, max: 3 }), (a, field, steps) => {
        const before = triageCheckIn(a).level;
        const after = triageCheckIn(worsen(a, field, steps)).level;
        expect(compareTriageLevels(after, before)).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 3000 },
    );
  });

  it("adding several symptoms at once never lowers the level", () => {
    fc.assert(
      fc.property(answersArb, fc.subarray(fields, { minLength: 1 }), (a, chosen) => {
        const worse = chosen.reduce((acc, f) => worsen(acc, f, 1), a);
        expect(compareTriageLevels(triageCheckIn(worse).level, triageCheckIn(a).level)).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 1000 },
    );
  });

  it("every result above self-care names at least one reason and one rule", () => {
    fc.assert(
      fc.property(answersArb, (a) => {
        const r = triageCheckIn(a);
        if (r.level !== "self-care") {
          expect(r.reasons.length).toBeGreaterThan(0);
          expect(r.ruleIds.length).toBeGreaterThan(0);
          expect(r.reasons.some((x) => x.level === r.level)).toBe(true);
        }
        expect(r.ruleIds.every((id) => TRIAGE_RULES.some((rule) => rule.id === id))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });
});
