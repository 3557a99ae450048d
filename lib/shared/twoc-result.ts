// What a trial-without-catheter outcome event holds (episode_events.details), read the same way
// by History, the GP summary and its PDF: each void (time of day when known, volume), the total,
// the residual after voiding, the symptoms, the reason a trial failed or was abandoned and what was
// done after it. Events saved before void times were kept hold only `voidsMl`; events saved before
// symptoms and reasons were kept hold neither.
import { TWOC_FAILED_ACTIONS, TWOC_SYMPTOMS, type TwocFailedAction, type TwocSymptom } from "@/lib/clinical";

export type TwocResult = {
  voids: { at: string | null; volumeMl: number }[];
  totalVoidedMl: number;
  postVoidResidualMl: number | null;
  symptoms: TwocSymptom[];
  reason: string | null;
  failedAction: TwocFailedAction | null;
};

const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);

export function twocResult(details: Record<string, unknown> | null | undefined): TwocResult {
  const d = details ?? {};
  const rich = Array.isArray(d.voids) ? (d.voids as { at?: unknown; volumeMl?: unknown }[]) : null;
  const voids = rich
    ? rich.flatMap((v) => (num(v?.volumeMl) === null ? [] : [{ at: typeof v.at === "string" ? v.at : null, volumeMl: num(v.volumeMl)! }]))
    : Array.isArray(d.voidsMl)
      ? (d.voidsMl as unknown[]).flatMap((ml) => (num(ml) === null ? [] : [{ at: null, volumeMl: num(ml)! }]))
      : [];
  const action = typeof d.failedAction === "string" && (TWOC_FAILED_ACTIONS as readonly string[]).includes(d.failedAction) ? (d.failedAction as TwocFailedAction) : null;
  const symptoms = Array.isArray(d.symptoms) ? TWOC_SYMPTOMS.filter((s) => (d.symptoms as unknown[]).includes(s)) : [];
  return {
    voids,
    totalVoidedMl: voids.reduce((s, v) => s + v.volumeMl, 0),
    postVoidResidualMl: num(d.postVoidResidualMl),
    symptoms,
    reason: typeof d.reason === "string" && d.reason.trim() ? d.reason : null,
    failedAction: action,
  };
}

/** "10:40 240 ml, 310 ml" — each void with its time when known, in the caller's words for ml. */
export function voidsText(result: TwocResult, ml: (n: number) => string): string {
  return result.voids.map((v) => (v.at ? `${v.at} ${ml(v.volumeMl)}` : ml(v.volumeMl))).join(", ");
}

type Say = (key: "voids" | "noVoids" | "residual" | "symptoms" | "reason" | "action", values?: Record<string, string | number>) => string;

/**
 * The result in short lines, worded by the caller's catalogue (Twoc.result.* on screens):
 * voids with the total, the residual, the symptoms, the reason, what was done.
 */
export function twocResultLines(
  result: TwocResult,
  say: Say,
  action: (a: TwocFailedAction) => string,
  symptom: (s: TwocSymptom) => string = (s) => s,
): string[] {
  const lines = [result.voids.length ? say("voids", { list: voidsText(result, (n) => `${n} ml`), total: result.totalVoidedMl }) : say("noVoids")];
  if (result.postVoidResidualMl !== null) lines.push(say("residual", { ml: result.postVoidResidualMl }));
  if (result.symptoms.length) lines.push(say("symptoms", { list: result.symptoms.map(symptom).join(", ") }));
  if (result.reason) lines.push(say("reason", { reason: result.reason }));
  if (result.failedAction) lines.push(say("action", { action: action(result.failedAction) }));
  return lines;
}
