// The "How am I?" check-in as a list of screens, shared by the phone (to show a result even
// offline) and the server (which recomputes the level and never trusts the phone's).
// Pure TypeScript: the rules themselves are lib/clinical's triageCheckIn; this file only decides
// the order of the questions and what an unfinished check-in may be scored as.
import { triageCheckIn, type CheckInAnswers, type Route, type TriageResult } from "@/lib/clinical";

/** What the phone sends: triageCheckIn's answers, without `route` and `afterCatheter` (the server takes them from the record). */
export type SubmittedAnswers = Partial<Omit<CheckInAnswers, "route" | "afterCatheter">>;

export type OtherSymptom = "leaking" | "cloudyOrSmelly" | "sediment" | "constipated" | "suprapubicSiteRed";

export type Question =
  | { id: "newConfusion" | "breathless" | "feelsVeryUnwell" | "shivering" | "catheterOut"; kind: "yes-no" }
  | { id: "temperatureC"; kind: "temperature" }
  | { id: "draining"; kind: "choice"; options: readonly ["yes", "less", "none"] }
  | { id: "hoursWithoutUrine"; kind: "choice"; options: readonly HoursBand[] }
  | { id: "passingUrine"; kind: "choice"; options: readonly ["yes", "little", "none", "not-sure"] }
  | { id: "pain"; kind: "choice"; options: readonly ["none", "mild", "severe"] }
  | { id: "blood"; kind: "choice"; options: readonly ["none", "pink", "red", "clots"] }
  | { id: "other"; kind: "many"; options: readonly OtherSymptom[] };

/**
 * Hours without urine as bands. A band is stored as its lower bound ("at least 12 hours"),
 * which is what the NG51 thresholds of triageCheckIn (12 h, 18 h) compare with; "less than 12"
 * and "not sure" send nothing (the "not draining" answer has already raised the level).
 */
export type HoursBand = "under-12" | "12-18" | "18-plus" | "not-sure";
export const HOURS_BAND_VALUE: Record<HoursBand, number | undefined> = {
  "under-12": undefined,
  "12-18": 12,
  "18-plus": 18,
  "not-sure": undefined,
};

/** Temperature as typed, in °C, within the range triageCheckIn accepts. */
export const TEMPERATURE_RANGE = { min: 30, max: 44 } as const;

/**
 * The screens in order. Red flags first (NICE NG51 signs that mean "emergency"), so that an
 * emergency answer goes straight to the result; then drainage, pain, blood and the rest.
 */
export function questionsFor(route: Route | null, afterCatheter = false): Question[] {
  // After the catheter: how the person passes urine replaces the catheter's questions; the
  // catheter's other symptoms (leaking around it, bits in the bag, the tummy site) do not apply.
  if (afterCatheter) {
    return [
      { id: "newConfusion", kind: "yes-no" },
      { id: "breathless", kind: "yes-no" },
      { id: "feelsVeryUnwell", kind: "yes-no" },
      { id: "shivering", kind: "yes-no" },
      { id: "temperatureC", kind: "temperature" },
      { id: "passingUrine", kind: "choice", options: ["yes", "little", "none", "not-sure"] as const },
      { id: "pain", kind: "choice", options: ["none", "mild", "severe"] as const },
      { id: "blood", kind: "choice", options: ["none", "pink", "red", "clots"] as const },
    ];
  }
  const other: OtherSymptom[] = ["leaking", "cloudyOrSmelly", "sediment", "constipated"];
  if (route === "suprapubic") other.push("suprapubicSiteRed");
  return [
    { id: "newConfusion", kind: "yes-no" },
    { id: "breathless", kind: "yes-no" },
    { id: "feelsVeryUnwell", kind: "yes-no" },
    { id: "shivering", kind: "yes-no" },
    { id: "temperatureC", kind: "temperature" },
    { id: "catheterOut", kind: "yes-no" },
    { id: "draining", kind: "choice", options: ["yes", "less", "none"] as const },
    { id: "hoursWithoutUrine", kind: "choice", options: ["under-12", "12-18", "18-plus", "not-sure"] as const },
    { id: "pain", kind: "choice", options: ["none", "mild", "severe"] as const },
    { id: "blood", kind: "choice", options: ["none", "pink", "red", "clots"] as const },
    { id: "other", kind: "many", options: other },
  ];
}

/**
 * Drainage is not asked once the catheter came out (there is nothing to drain, and its advice,
 * "check the tube is not kinked", would be wrong); the hours question only when less or no urine drains.
 */
export function isAsked(question: Question, answers: SubmittedAnswers): boolean {
  if (question.id === "draining") return answers.catheterOut !== true;
  if (question.id === "hoursWithoutUrine") return answers.catheterOut !== true && (answers.draining === "less" || answers.draining === "none");
  return true;
}

/** The answers of screens no longer asked (after an earlier answer changed) are dropped. */
export function keepAsked(questions: readonly Question[], answers: SubmittedAnswers): SubmittedAnswers {
  const dropped = new Set(questions.filter((q) => !isAsked(q, answers)).map((q) => q.id as string));
  return Object.fromEntries(Object.entries(answers).filter(([k]) => !dropped.has(k))) as SubmittedAnswers;
}

/** Pain always; how it drains unless the catheter came out; after the catheter, how urine passes. */
export function isComplete(answers: SubmittedAnswers, afterCatheter = false): boolean {
  if (afterCatheter) return answers.pain !== undefined && answers.passingUrine !== undefined;
  return answers.pain !== undefined && (answers.draining !== undefined || answers.catheterOut === true);
}

/**
 * Scores answers with triageCheckIn. An unfinished check-in (one that stopped at an emergency
 * answer) fills the two required answers with their mildest values ("draining", "no pain")
 * for scoring only: triageCheckIn never lowers the level for a worse answer, so if the mildest
 * fill already scores "emergency", every fill does. Anything else unfinished is not a result.
 */
export function scoreAnswers(answers: SubmittedAnswers, route: Route | null, afterCatheter = false): { result: TriageResult; complete: boolean } | null {
  const complete = isComplete(answers, afterCatheter);
  // After the catheter there is no drainage to score: the catheter's answers are dropped and
  // "draining" is filled as its mildest value; passing urine is scored instead.
  const given = afterCatheter ? stripUndefined({ ...answers, draining: undefined, hoursWithoutUrine: undefined, catheterOut: undefined }) : stripUndefined(answers);
  const filled: CheckInAnswers = {
    draining: answers.draining ?? "yes",
    pain: answers.pain ?? "none",
    ...given,
    ...(afterCatheter ? { draining: "yes" as const, afterCatheter: true } : {}),
    ...(route ? { route } : {}),
  };
  const result = triageCheckIn(filled);
  if (!complete && result.level !== "emergency") return null;
  return { result, complete };
}

/** True when the check-in should stop and show the result now. */
export function reachesEmergency(answers: SubmittedAnswers, route: Route | null, afterCatheter = false): boolean {
  return scoreAnswers(answers, route, afterCatheter)?.result.level === "emergency";
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** The message key of each level's first step, as triageCheckIn puts it first in `advice`. */
export const LEVEL_STEP_KEY = {
  emergency: "call-emergency",
  urgent: "call-team-now",
  soon: "tell-team-soon",
  "self-care": "self-care",
} as const;
