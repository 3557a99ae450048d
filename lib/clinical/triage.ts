import { ROUTES, type Route } from "./device-types";
import { ClinicalInputError, optionalBoolean, optionalNumber, optionalOneOf, requireOneOf } from "./errors";
import type { SourceId } from "./sources";

export const TRIAGE_LEVELS = ["self-care", "soon", "urgent", "emergency"] as const;
/** emergency: call the emergency number now · urgent: call the care team / out-of-hours line now · soon: within a day or at the next visit · self-care. */
export type TriageLevel = (typeof TRIAGE_LEVELS)[number];

export interface CheckInAnswers {
  draining: "yes" | "less" | "none";
  pain: "none" | "mild" | "severe";
  hoursWithoutUrine?: number;
  temperatureC?: number;
  shivering?: boolean;
  newConfusion?: boolean;
  feelsVeryUnwell?: boolean;
  breathless?: boolean;
  blood?: "none" | "pink" | "red" | "clots";
  leaking?: boolean;
  catheterOut?: boolean;
  cloudyOrSmelly?: boolean;
  sediment?: boolean;
  constipated?: boolean;
  suprapubicSiteRed?: boolean;
  /** Not a symptom: lets the rules add route-specific reasons (suprapubic catheter out). */
  route?: Route;
  /**
   * Not a symptom: the catheter has been taken out (a trial without catheter, or a removal) and
   * none is in place; the check-in then asks how the person passes urine instead of how it drains.
   */
  afterCatheter?: boolean;
  /** After the catheter: passing urine as usual, only a little at a time, not at all, or not sure. */
  passingUrine?: "yes" | "little" | "none" | "not-sure";
}

/** A stable key plus plain English (reading grade ≤ 6, addressed to "you"). Translate by key. */
export interface Phrase {
  key: string;
  text: string;
}

export interface TriageRule {
  id: string;
  level: TriageLevel;
  reason: Phrase;
  advice: readonly Phrase[];
  source: SourceId;
  when: (a: Readonly<CheckInAnswers>) => boolean;
}

export interface TriageResult {
  level: TriageLevel;
  /** One per fired rule, most serious first. */
  reasons: (Phrase & { ruleId: string; level: TriageLevel })[];
  ruleIds: string[];
  /** What to do: the level's main step first, then advice from the rules, without repeats. */
  advice: Phrase[];
  sources: SourceId[];
}

/** Thresholds used by the rules. */
export const TRIAGE_THRESHOLDS = {
  feverC: { value: 38, source: "idsa-cauti-2010" },
  lowTempC: { value: 36, source: "nice-ng51" },
  noUrineModerateHours: { value: 12, source: "nice-ng51" },
  noUrineHighHours: { value: 18, source: "nice-ng51" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

const T = TRIAGE_THRESHOLDS;
const fever = (a: CheckInAnswers) => a.temperatureC !== undefined && a.temperatureC >= T.feverC.value;
const lowTemp = (a: CheckInAnswers) => a.temperatureC !== undefined && a.temperatureC < T.lowTempC.value;
const hours = (a: CheckInAnswers) => a.hoursWithoutUrine ?? 0;

const ADVICE = {
  checkTube: { key: "check-tube", text: "Check the tube is not bent or kinked." },
  bagLow: { key: "bag-low", text: "Keep the bag below your bladder." },
  drink: { key: "drink", text: "Drink water through the day, unless told to limit it." },
  noAntibiotics: { key: "no-antibiotics", text: "Cloudy or smelly urine alone does not need antibiotics." },
  noDipstick: { key: "no-dipstick", text: "A dipstick test does not help when you have a catheter." },
  watchDrainage: { key: "watch-drainage", text: "Watch that urine keeps draining." },
  coverSite: { key: "cover-site", text: "Cover the hole with a clean dressing." },
  keepCatheter: { key: "keep-catheter", text: "Keep the catheter that came out to show the nurse." },
  // common practice, no source: a catheter that came out is never pushed back in at home.
  noReinsert: { key: "no-reinsert", text: "Do not try to put the catheter back in." },
  bowels: { key: "bowels", text: "Eat fibre and drink well. Ask about a laxative." },
  notAlone: { key: "not-alone", text: "Do not stay on your own if you can help it." },
  noWait: { key: "no-wait", text: "Do not wait until tomorrow." },
} as const satisfies Record<string, Phrase>;

const LEVEL_ADVICE: Record<TriageLevel, Phrase> = {
  emergency: { key: "call-emergency", text: "Call the emergency number now." },
  urgent: { key: "call-team-now", text: "Call your care team now. Out of hours, call the out-of-hours line." },
  soon: { key: "tell-team-soon", text: "Tell your care team today or tomorrow." },
  "self-care": { key: "self-care", text: "You can look after this at home." },
};

const WORSE: Phrase = { key: "if-worse", text: "If you get worse, call for help at once." };

/** Rules, most serious first. Each fires independently; the level is the highest that fired. */
export const TRIAGE_RULES: readonly TriageRule[] = [
  {
    id: "TRIAGE-NEW-CONFUSION", level: "emergency", source: "nice-ng51",
    reason: { key: "new-confusion", text: "You are newly confused." },
    advice: [ADVICE.notAlone], when: (a) => a.newConfusion === true,
  },
  {
    id: "TRIAGE-BREATHLESS", level: "emergency", source: "nice-ng51",
    reason: { key: "breathless", text: "You are short of breath." },
    advice: [ADVICE.notAlone], when: (a) => a.breathless === true,
  },
  {
    id: "TRIAGE-VERY-UNWELL", level: "emergency", source: "common-practice",
    reason: { key: "very-unwell", text: "You feel very unwell." },
    advice: [ADVICE.notAlone], when: (a) => a.feelsVeryUnwell === true,
  },
  {
    id: "TRIAGE-RIGORS-TEMPERATURE", level: "emergency", source: "idsa-cauti-2010",
    reason: { key: "rigors-temperature", text: "You are shaking and your temperature is not normal." },
    advice: [ADVICE.notAlone], when: (a) => a.shivering === true && (fever(a) || lowTemp(a)),
  },
  {
    id: "TRIAGE-NO-URINE-18H", level: "emergency", source: "nice-ng51",
    reason: { key: "no-urine-18h", text: "No urine for 18 hours or more." },
    advice: [], when: (a) => hours(a) >= T.noUrineHighHours.value,
  },
  {
    id: "TRIAGE-NO-URINE-12H", level: "urgent", source: "nice-ng51",
    reason: { key: "no-urine-12h", text: "No urine for 12 hours or more." },
    advice: [ADVICE.checkTube, ADVICE.bagLow], when: (a) => hours(a) >= T.noUrineModerateHours.value,
  },
  {
    id: "TRIAGE-NO-DRAINAGE", level: "urgent", source: "common-practice",
    reason: { key: "no-drainage", text: "Your catheter is not draining." },
    advice: [ADVICE.checkTube, ADVICE.bagLow], when: (a) => a.draining === "none",
  },
  {
    id: "TRIAGE-NO-DRAINAGE-PAIN", level: "urgent", source: "common-practice",
    reason: { key: "no-drainage-pain", text: "No urine is draining and you have pain." },
    advice: [ADVICE.checkTube, ADVICE.bagLow], when: (a) => a.draining === "none" && a.pain !== "none",
  },
  {
    id: "TRIAGE-LESS-DRAINAGE-SEVERE-PAIN", level: "urgent", source: "common-practice",
    reason: { key: "less-drainage-severe-pain", text: "Less urine is draining and you have bad pain." },
    advice: [ADVICE.checkTube, ADVICE.bagLow], when: (a) => a.draining === "less" && a.pain === "severe",
  },
  // After the catheter came out, retention is the danger: not passing urine needs help the same
  // day, and an answer of "not sure" is treated the same way (escalate when in doubt). Common
  // practice, no source (NHS trusts' trial-without-catheter leaflets give the same advice).
  {
    id: "TRIAGE-AFTER-NO-URINE", level: "urgent", source: "common-practice",
    reason: { key: "after-no-urine", text: "You cannot pass urine since the catheter came out." },
    advice: [ADVICE.noWait], when: (a) => a.afterCatheter === true && a.passingUrine === "none",
  },
  {
    id: "TRIAGE-AFTER-NOT-SURE", level: "urgent", source: "common-practice",
    reason: { key: "after-not-sure", text: "You are not sure you are passing urine." },
    advice: [ADVICE.noWait], when: (a) => a.afterCatheter === true && a.passingUrine === "not-sure",
  },
  {
    id: "TRIAGE-AFTER-LITTLE-PAIN", level: "urgent", source: "common-practice",
    reason: { key: "after-little-pain", text: "You pass only a little urine and you have pain." },
    advice: [ADVICE.noWait], when: (a) => a.afterCatheter === true && a.passingUrine === "little" && a.pain !== "none",
  },
  {
    id: "TRIAGE-CATHETER-OUT-SUPRAPUBIC", level: "urgent", source: "common-practice",
    reason: { key: "suprapubic-out", text: "Your tummy catheter came out. The hole starts to close within hours. A nurse must put in a new one soon." },
    advice: [ADVICE.noReinsert, ADVICE.coverSite, ADVICE.keepCatheter], when: (a) => a.catheterOut === true && a.route === "suprapubic",
  },
  {
    id: "TRIAGE-CATHETER-OUT", level: "urgent", source: "common-practice",
    reason: { key: "catheter-out", text: "Your catheter has come out." },
    advice: [ADVICE.noReinsert, ADVICE.keepCatheter], when: (a) => a.catheterOut === true,
  },
  {
    id: "TRIAGE-FEVER", level: "urgent", source: "idsa-cauti-2010",
    reason: { key: "fever", text: "You have a high temperature." },
    advice: [ADVICE.drink], when: fever,
  },
  {
    id: "TRIAGE-LOW-TEMPERATURE", level: "urgent", source: "nice-ng51",
    reason: { key: "low-temperature", text: "Your temperature is low." },
    advice: [], when: lowTemp,
  },
  {
    id: "TRIAGE-SHIVERING", level: "urgent", source: "idsa-cauti-2010",
    reason: { key: "shivering", text: "You are shaking or shivering." },
    advice: [], when: (a) => a.shivering === true,
  },
  {
    id: "TRIAGE-SEVERE-PAIN", level: "urgent", source: "idsa-cauti-2010",
    reason: { key: "severe-pain", text: "You have bad pain." },
    advice: [], when: (a) => a.pain === "severe",
  },
  {
    id: "TRIAGE-BLOOD-RED-OR-CLOTS", level: "urgent", source: "idsa-cauti-2010",
    reason: { key: "blood-red", text: "Your urine is red or has clots." },
    advice: [ADVICE.watchDrainage, ADVICE.drink], when: (a) => a.blood === "red" || a.blood === "clots",
  },
  {
    id: "TRIAGE-LESS-DRAINAGE", level: "soon", source: "common-practice",
    reason: { key: "less-drainage", text: "Less urine is draining than usual." },
    advice: [ADVICE.checkTube, ADVICE.bagLow, ADVICE.drink], when: (a) => a.draining === "less",
  },
  {
    id: "TRIAGE-AFTER-LITTLE", level: "soon", source: "common-practice",
    reason: { key: "after-little", text: "You pass only a little urine at a time." },
    advice: [ADVICE.drink], when: (a) => a.afterCatheter === true && a.passingUrine === "little",
  },
  {
    id: "TRIAGE-MILD-PAIN", level: "soon", source: "common-practice",
    reason: { key: "mild-pain", text: "You have some pain." },
    advice: [], when: (a) => a.pain === "mild",
  },
  {
    id: "TRIAGE-BLOOD-PINK", level: "soon", source: "common-practice",
    reason: { key: "blood-pink", text: "Your urine is pink." },
    advice: [ADVICE.drink, ADVICE.watchDrainage], when: (a) => a.blood === "pink",
  },
  {
    id: "TRIAGE-LEAKING", level: "soon", source: "constipation-blockage",
    reason: { key: "leaking", text: "Urine leaks around your catheter." },
    advice: [ADVICE.checkTube, ADVICE.bowels], when: (a) => a.leaking === true,
  },
  {
    id: "TRIAGE-CONSTIPATED", level: "soon", source: "constipation-blockage",
    reason: { key: "constipated", text: "You are constipated. It can block the catheter." },
    advice: [ADVICE.bowels], when: (a) => a.constipated === true,
  },
  {
    id: "TRIAGE-SUPRAPUBIC-SITE-RED", level: "soon", source: "nice-ng51",
    reason: { key: "site-red", text: "The skin around your tummy catheter is red." },
    advice: [], when: (a) => a.suprapubicSiteRed === true,
  },
  {
    id: "TRIAGE-CLOUDY-OR-SMELLY", level: "self-care", source: "nice-ng113-1.1.1",
    reason: { key: "cloudy-smelly", text: "Your urine is cloudy or smells." },
    advice: [ADVICE.drink, ADVICE.noAntibiotics, ADVICE.noDipstick], when: (a) => a.cloudyOrSmelly === true,
  },
  {
    id: "TRIAGE-SEDIMENT", level: "self-care", source: "common-practice",
    reason: { key: "sediment", text: "There are bits in your urine." },
    advice: [ADVICE.drink, ADVICE.watchDrainage], when: (a) => a.sediment === true,
  },
];

const RANK: Record<TriageLevel, number> = { "self-care": 0, soon: 1, urgent: 2, emergency: 3 };

export function compareTriageLevels(a: TriageLevel, b: TriageLevel): number {
  return RANK[a] - RANK[b];
}

function validate(answers: CheckInAnswers): CheckInAnswers {
  if (!answers || typeof answers !== "object") throw new ClinicalInputError("answers", "missing", "answers are required");
  const a: CheckInAnswers = {
    draining: requireOneOf("draining", answers.draining, ["yes", "less", "none"] as const),
    pain: requireOneOf("pain", answers.pain, ["none", "mild", "severe"] as const),
    hoursWithoutUrine: optionalNumber("hoursWithoutUrine", answers.hoursWithoutUrine, 0, 720),
    temperatureC: optionalNumber("temperatureC", answers.temperatureC, 25, 45),
    blood: optionalOneOf("blood", answers.blood, ["none", "pink", "red", "clots"] as const),
    route: optionalOneOf("route", answers.route, ROUTES),
    passingUrine: optionalOneOf("passingUrine", answers.passingUrine, ["yes", "little", "none", "not-sure"] as const),
  };
  for (const field of [
    "afterCatheter",
    "shivering", "newConfusion", "feelsVeryUnwell", "breathless", "leaking",
    "catheterOut", "cloudyOrSmelly", "sediment", "constipated", "suprapubicSiteRed",
  ] as const) {
    a[field] = optionalBoolean(field, answers[field]);
  }
  return a;
}

/**
 * Guidance level for a patient's or carer's check-in: the highest level among the rules
 * that fire (so a worse answer can never lower it). Sepsis signs follow NICE NG51, CA-UTI
 * symptoms IDSA 2010 and NICE NG113; cloudy or smelly urine alone is self-care (NG113
 * 1.1.1, QS90: no antibiotics, no dipstick). When in doubt the rules escalate.
 * General information, not a diagnosis. Local policy, the maker's instructions and
 * clinical judgement come first.
 */
export function triageCheckIn(answers: CheckInAnswers): TriageResult {
  const a = validate(answers);
  const fired = TRIAGE_RULES.filter((r) => r.when(a)).sort((x, y) => RANK[y.level] - RANK[x.level]);
  const level = fired.reduce<TriageLevel>((max, r) => (RANK[r.level] > RANK[max] ? r.level : max), "self-care");

  const advice: Phrase[] = [LEVEL_ADVICE[level]];
  const seen = new Set(advice.map((p) => p.key));
  for (const r of fired) {
    for (const p of r.advice) {
      if (!seen.has(p.key)) {
        seen.add(p.key);
        advice.push(p);
      }
    }
  }
  if (level === "self-care" && !seen.has(ADVICE.drink.key)) advice.push(ADVICE.drink);
  advice.push(WORSE);

  return {
    level,
    reasons: fired.map((r) => ({ ...r.reason, ruleId: r.id, level: r.level })),
    ruleIds: fired.map((r) => r.id),
    advice,
    sources: [...new Set(fired.map((r) => r.source))],
  };
}
