import { dayNumberToIso, parseIsoDate, toDayNumber, type DateInput } from "./dates";
import { MATERIAL_SPECS, MATERIALS, ROUTES, type Material, type Route } from "./device-types";
import { optionalNumber, requireOneOf } from "./errors";
import type { SourceId } from "./sources";

export type CaseloadState = "ok" | "due-soon" | "overdue";

export interface Episode {
  /** YYYY-MM-DD */
  insertedOn: string;
  material: Material;
  route: Route;
  /** The maker's maximum dwell, entered by the clinician; wins over the material default. */
  maxDwellDays?: number;
  /** A shorter planned interval chosen by the clinician (e.g. from blockagePattern). */
  plannedIntervalDays?: number;
  reviewIntervalDays?: number;
  /** YYYY-MM-DD of the last review of need; the next review counts from it. */
  lastReviewedOn?: string;
  /** YYYY-MM-DD; a removed catheter is no longer due anything. */
  removedOn?: string;
}

export interface PlanDatesOptions {
  today?: DateInput;
  /** Deployment defaults by material (admin settings). */
  defaultMaxDwellDays?: Partial<Record<Material, number>>;
  /** Deployment default for the review of need (default 28 days). */
  reviewIntervalDays?: number;
  /** Days ahead that count as due soon (default 7). */
  dueSoonDays?: number;
}

export interface PlannedDate {
  date: string;
  /** Negative when the date has passed. */
  daysUntil: number;
  state: CaseloadState;
  /** Where the interval came from. */
  basis: "maker" | "material-default" | "planned-interval" | "review-interval" | "at-change";
  intervalDays: number;
  source: SourceId;
}

export interface PlanDatesResult {
  active: boolean;
  change: PlannedDate;
  review: PlannedDate;
  /** Worst of change and review; always "ok" for a removed catheter. */
  state: CaseloadState;
}

export const PLAN_DEFAULTS = {
  /** Review of need at every change and regularly (SIGN 160); 28 days is our default. */
  reviewIntervalDays: { value: 28, source: "common-practice" },
  dueSoonDays: { value: 7, source: "common-practice" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

/** The planning values in force: the deployment's settings where set, else the rules' own defaults. */
export interface PlanDefaults {
  reviewIntervalDays: number;
  dueSoonDays: number;
  /** Change interval by material when the maker's maximum is not entered. */
  maxDwellDays: Record<Material, number>;
}

/** Fills what the deployment did not set with the rules' defaults (PLAN_DEFAULTS, MATERIAL_SPECS). */
export function planDefaults(options: Omit<PlanDatesOptions, "today"> = {}): PlanDefaults {
  return {
    reviewIntervalDays:
      optionalNumber("options.reviewIntervalDays", options.reviewIntervalDays, 1, 366) ?? PLAN_DEFAULTS.reviewIntervalDays.value,
    dueSoonDays: optionalNumber("dueSoonDays", options.dueSoonDays, 0, 90) ?? PLAN_DEFAULTS.dueSoonDays.value,
    maxDwellDays: Object.fromEntries(
      MATERIALS.map((m) => [
        m,
        optionalNumber(`options.defaultMaxDwellDays.${m}`, options.defaultMaxDwellDays?.[m], 1, 366) ?? MATERIAL_SPECS[m].defaultMaxDwellDays,
      ]),
    ) as Record<Material, number>,
  };
}

const STATE_ORDER: Record<CaseloadState, number> = { ok: 0, "due-soon": 1, overdue: 2 };

export function worseState(a: CaseloadState, b: CaseloadState): CaseloadState {
  return STATE_ORDER[a] >= STATE_ORDER[b] ? a : b;
}

export function stateFor(daysUntil: number, dueSoonDays: number): CaseloadState {
  if (daysUntil < 0) return "overdue";
  return daysUntil <= dueSoonDays ? "due-soon" : "ok";
}

/**
 * Planned change date (maker's maximum dwell, else the material default, shortened by a
 * planned interval if one is set), review-of-need date (the review interval, and never
 * later than the change: need is reviewed at every change, SIGN 160), and the caseload
 * state: overdue once a date has passed, due-soon within 7 days (today counts as due-soon).
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function planDates(episode: Episode, options: PlanDatesOptions = {}): PlanDatesResult {
  const inserted = parseIsoDate("insertedOn", episode.insertedOn);
  const material = requireOneOf("material", episode.material, MATERIALS);
  requireOneOf("route", episode.route, ROUTES);
  const maker = optionalNumber("maxDwellDays", episode.maxDwellDays, 1, 366);
  const planned = optionalNumber("plannedIntervalDays", episode.plannedIntervalDays, 1, 366);
  const today = toDayNumber("today", options.today);
  const defaults = planDefaults(options);
  const dueSoon = defaults.dueSoonDays;
  const reviewInterval = optionalNumber("reviewIntervalDays", episode.reviewIntervalDays, 1, 366) ?? defaults.reviewIntervalDays;
  const materialDefault = defaults.maxDwellDays[material];

  let changeInterval = maker ?? materialDefault;
  let changeBasis: PlannedDate["basis"] = maker !== undefined ? "maker" : "material-default";
  let changeSource: SourceId = maker !== undefined ? "rcn-2012-dwell" : MATERIAL_SPECS[material].source;
  if (planned !== undefined && planned < changeInterval) {
    changeInterval = planned;
    changeBasis = "planned-interval";
    changeSource = "common-practice";
  }

  const removed = episode.removedOn !== undefined ? parseIsoDate("removedOn", episode.removedOn) : undefined;
  const active = removed === undefined || removed > today;

  const make = (from: number, intervalDays: number, basis: PlannedDate["basis"], source: SourceId): PlannedDate => {
    const day = from + intervalDays;
    const daysUntil = day - today;
    return {
      date: dayNumberToIso(day),
      daysUntil,
      state: active ? stateFor(daysUntil, dueSoon) : "ok",
      basis,
      intervalDays,
      source,
    };
  };

  const change = make(inserted, changeInterval, changeBasis, changeSource);
  const lastReview =
    episode.lastReviewedOn !== undefined ? Math.max(inserted, parseIsoDate("lastReviewedOn", episode.lastReviewedOn)) : inserted;
  const review =
    lastReview + reviewInterval < inserted + changeInterval
      ? make(lastReview, reviewInterval, "review-interval", PLAN_DEFAULTS.reviewIntervalDays.source)
      : make(inserted, changeInterval, "at-change", "sign-160");
  return { active, change, review, state: worseState(change.state, review.state) };
}
