import {
  ClinicalInputError,
  requireBoolean,
  requireNumber,
  requireOneOf,
} from "./errors";
import type { SourceId } from "./sources";

/** ACVPU: alert, new confusion, responds to voice, to pain, unresponsive. */
export const CONSCIOUSNESS_LEVELS = ["A", "C", "V", "P", "U"] as const;
export type Consciousness = (typeof CONSCIOUSNESS_LEVELS)[number];

export interface News2Observations {
  respirationRate: number;
  spo2: number;
  spo2Scale: 1 | 2;
  onOxygen: boolean;
  systolicBp: number;
  pulse: number;
  /** A = alert; C = new confusion; V, P, U = responds to voice, pain, unresponsive. */
  consciousness: Consciousness;
  temperatureC: number;
}

export const NEWS2_RISKS = ["low", "low-medium", "medium", "high"] as const;
export type News2Risk = (typeof NEWS2_RISKS)[number];

/**
 * Stable key plus English text (chart 4). Other code translates by key:
 * - `routine`: total 0
 * - `ward-assessment`: total 1-4
 * - `urgent-ward-review`: a single parameter scores 3, total 0-4
 * - `urgent`: total 5-6
 * - `emergency`: total 7 or more
 */
export const NEWS2_RESPONSE_KEYS = ["routine", "ward-assessment", "urgent-ward-review", "urgent", "emergency"] as const;
export type News2ResponseKey = (typeof NEWS2_RESPONSE_KEYS)[number];

export interface News2Response {
  key: News2ResponseKey;
  text: string;
  /** Minimum monitoring frequency, as chart 4 states it. */
  monitoring: string;
  source: SourceId;
}

export interface News2Result {
  total: number;
  subscores: {
    respirationRate: number;
    spo2: number;
    air: number;
    systolicBp: number;
    pulse: number;
    consciousness: number;
    temperature: number;
  };
  risk: News2Risk;
  response: News2Response;
}

/** A band scores `score` when value <= `upTo` (the first matching band wins). */
interface Band {
  upTo: number;
  score: number;
  source: SourceId;
}

const C1: SourceId = "rcp-news2-2017-chart1";

/** RCP NEWS2 chart 1, as upper-inclusive bands on the chart's own resolution. */
export const NEWS2_BANDS = {
  respirationRate: [
    { upTo: 8, score: 3, source: C1 },
    { upTo: 11, score: 1, source: C1 },
    { upTo: 20, score: 0, source: C1 },
    { upTo: 24, score: 2, source: C1 },
    { upTo: Infinity, score: 3, source: C1 },
  ],
  spo2Scale1: [
    { upTo: 91, score: 3, source: C1 },
    { upTo: 93, score: 2, source: C1 },
    { upTo: 95, score: 1, source: C1 },
    { upTo: Infinity, score: 0, source: C1 },
  ],
  /** Scale 2 on air: 88 and above scores 0. */
  spo2Scale2Air: [
    { upTo: 83, score: 3, source: C1 },
    { upTo: 85, score: 2, source: C1 },
    { upTo: 87, score: 1, source: C1 },
    { upTo: Infinity, score: 0, source: C1 },
  ],
  /** Scale 2 on oxygen: 93 and above scores upward (over-oxygenation in hypercapnic failure). */
  spo2Scale2Oxygen: [
    { upTo: 83, score: 3, source: C1 },
    { upTo: 85, score: 2, source: C1 },
    { upTo: 87, score: 1, source: C1 },
    { upTo: 92, score: 0, source: C1 },
    { upTo: 94, score: 1, source: C1 },
    { upTo: 96, score: 2, source: C1 },
    { upTo: Infinity, score: 3, source: C1 },
  ],
  systolicBp: [
    { upTo: 90, score: 3, source: C1 },
    { upTo: 100, score: 2, source: C1 },
    { upTo: 110, score: 1, source: C1 },
    { upTo: 219, score: 0, source: C1 },
    { upTo: Infinity, score: 3, source: C1 },
  ],
  pulse: [
    { upTo: 40, score: 3, source: C1 },
    { upTo: 50, score: 1, source: C1 },
    { upTo: 90, score: 0, source: C1 },
    { upTo: 110, score: 1, source: C1 },
    { upTo: 130, score: 2, source: C1 },
    { upTo: Infinity, score: 3, source: C1 },
  ],
  temperature: [
    { upTo: 35.0, score: 3, source: C1 },
    { upTo: 36.0, score: 1, source: C1 },
    { upTo: 38.0, score: 0, source: C1 },
    { upTo: 39.0, score: 1, source: C1 },
    { upTo: Infinity, score: 2, source: C1 },
  ],
} as const satisfies Record<string, readonly Band[]>;

/**
 * Plausibility bounds (our choice, not from the chart): values outside are far more
 * likely a typing error than a reading, so they throw instead of scoring.
 */
export const NEWS2_BOUNDS = {
  respirationRate: { min: 0, max: 80 },
  spo2: { min: 20, max: 100 },
  systolicBp: { min: 40, max: 300 },
  pulse: { min: 20, max: 300 },
  temperatureC: { min: 25, max: 45 },
} as const;

export const NEWS2_RESPONSES: Record<News2ResponseKey, News2Response> = {
  routine: {
    key: "routine",
    text: "Continue routine NEWS2 monitoring.",
    monitoring: "at least every 12 hours",
    source: "rcp-news2-2017-chart4",
  },
  "ward-assessment": {
    key: "ward-assessment",
    text: "A registered nurse assesses the patient and decides whether care or monitoring must change.",
    monitoring: "at least every 4-6 hours",
    source: "rcp-news2-2017-chart4",
  },
  "urgent-ward-review": {
    key: "urgent-ward-review",
    text: "A registered nurse informs the medical team caring for the patient, who review and decide whether escalation is needed.",
    monitoring: "at least every hour",
    source: "rcp-news2-2017-chart4",
  },
  urgent: {
    key: "urgent",
    text: "Urgent response: a registered nurse informs the medical team at once; urgent assessment by a clinician competent in acute illness.",
    monitoring: "at least every hour",
    source: "rcp-news2-2017-chart4",
  },
  emergency: {
    key: "emergency",
    text: "Emergency response: emergency assessment by a team with critical-care skills; consider transfer to a higher level of care.",
    monitoring: "continuous",
    source: "rcp-news2-2017-chart4",
  },
};

function bandScore(bands: readonly Band[], value: number): number {
  for (const band of bands) if (value <= band.upTo) return band.score;
  /* c8 ignore next */
  throw new Error("unreachable: bands end at Infinity");
}

/**
 * The chart is written at a fixed resolution (whole numbers; 0.1 °C). A value between two
 * steps (e.g. a pulse of 90.5) takes the higher of its two neighbours' scores: when in
 * doubt, the more cautious score.
 */
function scoreAt(bands: readonly Band[], value: number, step: number): number {
  const scaled = Math.round((value / step) * 1e6) / 1e6;
  const lo = Math.floor(scaled) * step;
  const hi = Math.ceil(scaled) * step;
  return Math.max(bandScore(bands, lo), bandScore(bands, hi));
}

function bounded(field: keyof typeof NEWS2_BOUNDS, value: unknown): number {
  const { min, max } = NEWS2_BOUNDS[field];
  return requireNumber(field, value, min, max);
}

/**
 * NEWS2 (RCP 2017, charts 1 and 4). Throws ClinicalInputError for a missing or
 * implausible value rather than scoring it. Use SpO2 scale 2 only for patients whose
 * target range is 88-92 % as prescribed by a clinician.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function scoreNews2(obs: News2Observations): News2Result {
  if (obs === null || typeof obs !== "object") {
    throw new ClinicalInputError("observations", "missing", "observations are required");
  }
  const rr = bounded("respirationRate", obs.respirationRate);
  const spo2 = bounded("spo2", obs.spo2);
  const scale = requireOneOf("spo2Scale", obs.spo2Scale, [1, 2] as const);
  const onOxygen = requireBoolean("onOxygen", obs.onOxygen);
  const sbp = bounded("systolicBp", obs.systolicBp);
  const pulse = bounded("pulse", obs.pulse);
  const acvpu = requireOneOf("consciousness", obs.consciousness, ["A", "C", "V", "P", "U"] as const);
  const temp = bounded("temperatureC", obs.temperatureC);

  const spo2Bands =
    scale === 1 ? NEWS2_BANDS.spo2Scale1 : onOxygen ? NEWS2_BANDS.spo2Scale2Oxygen : NEWS2_BANDS.spo2Scale2Air;

  const subscores = {
    respirationRate: scoreAt(NEWS2_BANDS.respirationRate, rr, 1),
    spo2: scoreAt(spo2Bands, spo2, 1),
    air: onOxygen ? 2 : 0,
    systolicBp: scoreAt(NEWS2_BANDS.systolicBp, sbp, 1),
    pulse: scoreAt(NEWS2_BANDS.pulse, pulse, 1),
    consciousness: acvpu === "A" ? 0 : 3,
    temperature: scoreAt(NEWS2_BANDS.temperature, temp, 0.1),
  };
  const values = Object.values(subscores);
  const total = values.reduce((a, b) => a + b, 0);
  const singleThree = values.some((s) => s === 3);

  let risk: News2Risk;
  let key: News2ResponseKey;
  if (total >= 7) [risk, key] = ["high", "emergency"];
  else if (total >= 5) [risk, key] = ["medium", "urgent"];
  else if (singleThree) [risk, key] = ["low-medium", "urgent-ward-review"];
  else [risk, key] = ["low", total === 0 ? "routine" : "ward-assessment"];

  return { total, subscores, risk, response: NEWS2_RESPONSES[key] };
}
