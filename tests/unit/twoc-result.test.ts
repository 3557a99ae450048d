import { describe, expect, it } from "vitest";
import { twocResult, twocResultLines, voidsText } from "@/lib/shared/twoc-result";

const say = (key: string, values?: Record<string, string | number>) => `${key}${values ? ` ${JSON.stringify(values)}` : ""}`;

describe("twocResult", () => {
  it("reads voids with their times, the total, the residual and the action", () => {
    const r = twocResult({ voids: [{ at: "10:40", volumeMl: 240 }, { at: null, volumeMl: 310 }], postVoidResidualMl: 80, failedAction: null });
    expect(r).toEqual({ voids: [{ at: "10:40", volumeMl: 240 }, { at: null, volumeMl: 310 }], totalVoidedMl: 550, postVoidResidualMl: 80, symptoms: [], reason: null, failedAction: null });
    expect(voidsText(r, (n) => `${n} ml`)).toBe("10:40 240 ml, 310 ml");
  });
  it("reads events saved before void times were kept (voidsMl only)", () => {
    const r = twocResult({ voidsMl: [220, 310], totalVoidedMl: 530, postVoidResidualMl: 60, failedAction: "re-catheterised" });
    expect(r).toMatchObject({ totalVoidedMl: 530, failedAction: "re-catheterised" });
    expect(r.voids.every((v) => v.at === null)).toBe(true);
  });
  it("ignores what it cannot read and says when nothing was voided", () => {
    const r = twocResult({ voids: [{ volumeMl: "x" }], failedAction: "made-up", postVoidResidualMl: "5", symptoms: ["made-up"], reason: "  " });
    expect(r).toEqual({ voids: [], totalVoidedMl: 0, postVoidResidualMl: null, symptoms: [], reason: null, failedAction: null });
    expect(twocResultLines(r, say, (a) => a)).toEqual(["noVoids"]);
    expect(twocResultLines(twocResult({ voidsMl: [40], postVoidResidualMl: 650, failedAction: "re-catheterised" }), say, (a) => a.toUpperCase())).toEqual([
      'voids {"list":"40 ml","total":40}',
      'residual {"ml":650}',
      'action {"action":"RE-CATHETERISED"}',
    ]);
  });
  it("gives the symptoms (in the vocabulary's order) and the reason of a failed or abandoned trial", () => {
    const r = twocResult({ voids: [], symptoms: ["fever", "urgency"], reason: "Unwell, trial stopped", failedAction: "referred" });
    expect(r).toMatchObject({ symptoms: ["urgency", "fever"], reason: "Unwell, trial stopped" });
    expect(twocResultLines(r, say, (a) => a, (s) => s.toUpperCase())).toEqual([
      "noVoids",
      'symptoms {"list":"URGENCY, FEVER"}',
      'reason {"reason":"Unwell, trial stopped"}',
      'action {"action":"referred"}',
    ]);
  });
});
