// The check-in screens around lib/clinical's triageCheckIn: red flags first, an emergency answer
// ends the check-in at once, an unfinished check-in scores only when it is an emergency, and
// every reason and piece of advice the rules can give has words in every locale.
import fs from "node:fs";
import path from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isAsked, isComplete, keepAsked, LEVEL_STEP_KEY, questionsFor, reachesEmergency, scoreAnswers, type SubmittedAnswers } from "@/lib/shared/check-in-flow";
import { TRIAGE_LEVELS, TRIAGE_RULES, triageCheckIn, type CheckInAnswers } from "@/lib/clinical";
import { locales } from "@/lib/i18n/routing";
import { palette } from "@/tailwind.config";

// WCAG 2.x relative luminance contrast.
function contrast(a: string, b: string) {
  const lum = (hex: string) => {
    const [r, g, bl] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
    return 0.2126 * r + 0.7152 * g + 0.0722 * bl;
  };
  const [hi, lo] = [lum(a), lum(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const load = (l: string) => JSON.parse(fs.readFileSync(path.resolve(__dirname, `../../messages/${l}.json`), "utf8"));

describe("question order", () => {
  it("asks the NICE NG51 red flags before anything else", () => {
    const ids = questionsFor("urethral").map((q) => q.id);
    expect(ids.slice(0, 4)).toEqual(["newConfusion", "breathless", "feelsVeryUnwell", "shivering"]);
    expect(ids.indexOf("temperatureC")).toBeLessThan(ids.indexOf("pain"));
  });

  it("asks about the skin round a tummy catheter only for a suprapubic catheter", () => {
    const other = (r: "urethral" | "suprapubic") => questionsFor(r).find((q) => q.id === "other")!;
    expect(other("suprapubic").kind === "many" && other("suprapubic").options).toContain("suprapubicSiteRed");
    expect(other("urethral").kind === "many" && other("urethral").options).not.toContain("suprapubicSiteRed");
  });

  it("asks how long without urine only when less or none drains", () => {
    const q = questionsFor(null).find((x) => x.id === "hoursWithoutUrine")!;
    expect(isAsked(q, { draining: "yes" })).toBe(false);
    expect(isAsked(q, { draining: "less" })).toBe(true);
    expect(isAsked(q, { draining: "none" })).toBe(true);
  });

  it("reaches a result in at most 11 taps (10 when urine drains)", () => {
    const all = questionsFor("suprapubic");
    expect(all.filter((q) => isAsked(q, { draining: "yes" }))).toHaveLength(10);
    expect(all.filter((q) => isAsked(q, { draining: "none" }))).toHaveLength(11);
  });
});

describe("scoring", () => {
  it.each([
    [{ newConfusion: true }],
    [{ newConfusion: false, breathless: true }],
    [{ newConfusion: false, breathless: false, feelsVeryUnwell: true }],
    [{ shivering: true, temperatureC: 38.6 }],
    [{ draining: "none", hoursWithoutUrine: 18 }],
  ] as SubmittedAnswers[][])("an emergency answer ends the check-in: %j", (answers) => {
    expect(reachesEmergency(answers, null)).toBe(true);
    expect(scoreAnswers(answers, null)?.result.level).toBe("emergency");
    expect(scoreAnswers(answers, null)?.complete).toBe(isComplete(answers));
  });

  it("an unfinished check-in that is not an emergency is not a result", () => {
    expect(scoreAnswers({ newConfusion: false, shivering: true }, null)).toBeNull();
    expect(reachesEmergency({ shivering: true }, null)).toBe(false);
  });

  it("scores a finished check-in exactly as triageCheckIn does (no rule of its own)", () => {
    const answer = fc.record(
      {
        draining: fc.constantFrom("yes", "less", "none"),
        pain: fc.constantFrom("none", "mild", "severe"),
        hoursWithoutUrine: fc.option(fc.constantFrom(12, 18), { nil: undefined }),
        temperatureC: fc.option(fc.double({ min: 30, max: 44, noNaN: true }), { nil: undefined }),
        shivering: fc.boolean(),
        newConfusion: fc.boolean(),
        feelsVeryUnwell: fc.boolean(),
        breathless: fc.boolean(),
        blood: fc.constantFrom("none", "pink", "red", "clots"),
        leaking: fc.boolean(),
        catheterOut: fc.boolean(),
        cloudyOrSmelly: fc.boolean(),
        sediment: fc.boolean(),
        constipated: fc.boolean(),
        suprapubicSiteRed: fc.boolean(),
      },
      { requiredKeys: ["draining", "pain"] },
    );
    fc.assert(
      fc.property(answer, fc.constantFrom("urethral", "suprapubic") as fc.Arbitrary<"urethral" | "suprapubic">, (a, route) => {
        const clean = Object.fromEntries(Object.entries(a).filter(([, v]) => v !== undefined)) as SubmittedAnswers;
        const ours = scoreAnswers(clean, route)!;
        const theirs = triageCheckIn({ ...(clean as CheckInAnswers), route });
        expect(ours.complete).toBe(true);
        expect(ours.result.level).toBe(theirs.level);
        expect(ours.result.ruleIds).toEqual(theirs.ruleIds);
      }),
      { numRuns: 300 },
    );
  });

  it("LEVEL_STEP_KEY names the first step triageCheckIn gives for each level", () => {
    const samples: Record<string, CheckInAnswers> = {
      emergency: { draining: "yes", pain: "none", newConfusion: true },
      urgent: { draining: "none", pain: "none" },
      soon: { draining: "yes", pain: "mild" },
      "self-care": { draining: "yes", pain: "none" },
    };
    for (const level of TRIAGE_LEVELS) {
      const r = triageCheckIn(samples[level]);
      expect(r.level).toBe(level);
      expect(r.advice[0].key).toBe(LEVEL_STEP_KEY[level]);
    }
  });
});

describe("words for every rule", () => {
  const reasonKeys = [...new Set(TRIAGE_RULES.map((r) => r.reason.key))];
  const adviceKeys = [...new Set([...TRIAGE_RULES.flatMap((r) => r.advice.map((a) => a.key)), ...Object.values(LEVEL_STEP_KEY), "if-worse", "drink"])];

  it.each([...locales])("%s has a reason and advice text for every triage rule, and a word for every level", (locale) => {
    const m = load(locale).CheckIn;
    expect(reasonKeys.filter((k) => !m.reason[k])).toEqual([]);
    expect(adviceKeys.filter((k) => !m.advice[k])).toEqual([]);
    for (const l of TRIAGE_LEVELS) expect(m.level[l]).toBeTruthy();
  });

  it("the English words are the rules' own plain English", () => {
    const m = load("en").CheckIn;
    for (const r of TRIAGE_RULES) expect(m.reason[r.reason.key]).toBe(r.reason.text);
  });
});

describe("level marks are not colour alone and stand out (WCAG 1.4.11)", () => {
  it.each([
    ["emergency", palette.level.emergency],
    ["urgent", palette.level.urgent],
    ["soon", palette.level.soon],
    ["self-care", palette.level.selfcare],
  ] as const)("%s mark ≥ 3:1 on its soft fill, text ≥ 4.5:1", (_l, c) => {
    expect(contrast(c.DEFAULT, c.soft)).toBeGreaterThanOrEqual(3);
    expect(contrast(c.ink, c.soft)).toBeGreaterThanOrEqual(4.5);
  });
});

describe("catheter out, and answers kept when going back", () => {
  it("after 'it came out' drainage is not asked, and the advice never talks about the tube or the bag", () => {
    const questions = questionsFor("urethral");
    const out = { catheterOut: true, pain: "none" } as const;
    const asked = questions.filter((q) => isAsked(q, out)).map((q) => q.id);
    expect(asked).not.toContain("draining");
    expect(asked).not.toContain("hoursWithoutUrine");
    expect(isComplete(out)).toBe(true);
    const scored = scoreAnswers(out, "urethral")!;
    const advice = scored.result.advice.map((a) => a.key);
    expect(advice).toContain("no-reinsert");
    expect(advice).not.toContain("check-tube");
    expect(advice).not.toContain("bag-low");
    expect(scored.result.level).toBe("urgent");
  });

  it("a suprapubic catheter out says why it is urgent", () => {
    const scored = scoreAnswers({ catheterOut: true, pain: "none" }, "suprapubic")!;
    expect(scored.result.reasons.map((r) => r.key)).toContain("suprapubic-out");
    expect(scored.result.reasons.find((r) => r.key === "suprapubic-out")!.text).toMatch(/close within hours/);
  });

  it("changing an earlier answer drops only the answers no longer asked", () => {
    const questions = questionsFor(null);
    const kept = keepAsked(questions, { draining: "yes", hoursWithoutUrine: 18, pain: "mild", leaking: true });
    expect(kept).toEqual({ draining: "yes", pain: "mild", leaking: true });
    expect(keepAsked(questions, { catheterOut: true, draining: "none", pain: "none" })).toEqual({ catheterOut: true, pain: "none" });
  });
});

describe("after the catheter (no catheter in place since one came out)", () => {
  const after = (a: SubmittedAnswers) => scoreAnswers(a, null, true);
  it("asks how urine passes instead of the catheter's questions, red flags still first", () => {
    const ids = questionsFor(null, true).map((q) => q.id);
    expect(ids.slice(0, 4)).toEqual(["newConfusion", "breathless", "feelsVeryUnwell", "shivering"]);
    expect(ids).toContain("passingUrine");
    for (const gone of ["catheterOut", "draining", "hoursWithoutUrine", "other"]) expect(ids).not.toContain(gone);
    expect(isComplete({ pain: "none" }, true)).toBe(false);
    expect(isComplete({ pain: "none", passingUrine: "yes" }, true)).toBe(true);
  });

  it.each<[string, SubmittedAnswers, string, string?]>([
    // common practice, no source (NHS trusts' TWOC leaflets): passing urine as usual, no other symptom
    ["passing urine as usual", { passingUrine: "yes", pain: "none" }, "self-care"],
    // common practice, no source: unable to pass urine after removal (retention) → help the same day
    ["unable to pass urine", { passingUrine: "none", pain: "none" }, "urgent", "TRIAGE-AFTER-NO-URINE"],
    // common practice, no source: triage escalates when in doubt
    ["not sure", { passingUrine: "not-sure", pain: "none" }, "urgent", "TRIAGE-AFTER-NOT-SURE"],
    // common practice, no source: small amounts with pain may be retention with overflow
    ["a little at a time with some pain", { passingUrine: "little", pain: "mild" }, "urgent", "TRIAGE-AFTER-LITTLE-PAIN"],
    // common practice, no source
    ["a little at a time, no pain", { passingUrine: "little", pain: "none" }, "soon", "TRIAGE-AFTER-LITTLE"],
    // Source: IDSA CA-UTI guideline 2010 (severe pain, fever) — the same rules as with a catheter
    ["severe pain", { passingUrine: "yes", pain: "severe" }, "urgent", "TRIAGE-SEVERE-PAIN"],
    // Source: IDSA CA-UTI guideline 2010 (new or worse fever ≥ 38 °C)
    ["fever 38.2 °C", { passingUrine: "yes", pain: "none", temperatureC: 38.2 }, "urgent", "TRIAGE-FEVER"],
    // Source: NICE NG51 (new altered mental state)
    ["new confusion", { newConfusion: true }, "emergency", "TRIAGE-NEW-CONFUSION"],
  ])("%s → %s", (_, answers, level, rule) => {
    const scored = after(answers);
    expect(scored?.result.level).toBe(level);
    if (rule) expect(scored?.result.ruleIds).toContain(rule);
  });

  it("never scores the catheter's drainage: a stale 'not draining' answer is ignored after the catheter", () => {
    const scored = after({ passingUrine: "yes", pain: "none", draining: "none", hoursWithoutUrine: 18 });
    expect(scored?.result.level).toBe("self-care");
    expect(scored?.result.ruleIds).toEqual([]);
  });

  it("without the after-catheter context the passing-urine rules never fire", () => {
    expect(triageCheckIn({ draining: "yes", pain: "none", passingUrine: "none" }).ruleIds).toEqual([]);
  });

  it("has words for the new question in every locale, for the patient and a carer", () => {
    for (const l of locales) {
      const q = load(l).CheckIn.questions;
      for (const who of ["self", "carer"]) {
        expect(q.passingUrine[who], l).toBeTruthy();
        expect(q.painAfter[who], l).toBeTruthy();
      }
      for (const o of ["yes", "little", "none", "not-sure"]) expect(q.passingUrine.options[o], `${l} ${o}`).toBeTruthy();
    }
  });
});
