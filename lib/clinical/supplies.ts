import { dayNumberToIso, parseIsoDate, toDayNumber, type DateInput } from "./dates";
import { ClinicalInputError, optionalBoolean, optionalNumber, requireNumber, requireOneOf } from "./errors";
import type { SourceId } from "./sources";

/** Change intervals for drainage equipment, each with its source. */
export const BAG_INTERVALS = {
  /** NHS patient pages: leg bags and valves every 7 days (makers say 5-7). */
  legBagDays: { value: 7, source: "nhs-patient-catheter" },
  valveDays: { value: 7, source: "nhs-patient-catheter" },
  /** Night bags are single use: a new one each night. */
  nightBagDays: { value: 1, source: "nhs-patient-catheter" },
  spareCatheters: { value: 1, source: "common-practice" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

export interface SupplyPlan {
  /** Planned catheter change interval in days (from planDates or blockagePattern). */
  changeIntervalDays: number;
  /**
   * Days from the start of the period to the catheter's next planned change (0: today). When
   * given, catheters are counted on the real change days (that day, then every interval)
   * instead of as if the catheter had just gone in.
   */
  firstChangeInDays?: number;
  /** Defaults: leg bag yes, valve no, night bag yes, gel yes, 1 spare catheter. */
  legBag?: boolean;
  valve?: boolean;
  nightBag?: boolean;
  gel?: boolean;
  spareCatheters?: number;
  /** Deployment or maker overrides of the bag and valve intervals. */
  legBagChangeDays?: number;
  valveChangeDays?: number;
}

export const SUPPLY_ITEMS = ["catheter", "leg-bag", "night-bag", "valve", "gel"] as const;
export type SupplyItemKind = (typeof SUPPLY_ITEMS)[number];

export interface SupplyLine {
  item: SupplyItemKind;
  quantity: number;
  /** The interval the quantity was worked out from. */
  intervalDays: number;
  /** Extra items on top of the schedule (spare catheters; gel for each spare). */
  spares: number;
  source: SourceId;
}

export interface SupplyList {
  days: number;
  lines: SupplyLine[];
}

/**
 * The change interval to plan supplies on: the planned interval, or the blockage pattern's
 * shorter one when the patient's catheters block sooner (a patient who blocks every three weeks
 * needs a catheter every three weeks, not every 84 days). Common practice, no source.
 */
export function supplyChangeInterval(plannedIntervalDays: number, blockageIntervalDays?: number | null): number {
  const planned = requireNumber("plannedIntervalDays", plannedIntervalDays, 1, 366);
  const blockage = blockageIntervalDays === null ? undefined : optionalNumber("blockageIntervalDays", blockageIntervalDays, 1, 366);
  return blockage !== undefined && blockage < planned ? blockage : planned;
}

/**
 * Supplies for `days` days: catheters per planned change plus spares (common practice),
 * one gel per catheter, leg bags and valves every 7 days, one night bag per night.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function suppliesFor(plan: SupplyPlan, days: number): SupplyList {
  if (!plan || typeof plan !== "object") throw new ClinicalInputError("plan", "missing", "plan is required");
  requireNumber("days", days, 1, 366);
  if (!Number.isInteger(days)) throw new ClinicalInputError("days", "invalid", "must be whole days");
  const change = requireNumber("changeIntervalDays", plan.changeIntervalDays, 1, 366);
  const spares = optionalNumber("spareCatheters", plan.spareCatheters, 0, 10) ?? BAG_INTERVALS.spareCatheters.value;
  const legBagDays = optionalNumber("legBagChangeDays", plan.legBagChangeDays, 1, 31) ?? BAG_INTERVALS.legBagDays.value;
  const valveDays = optionalNumber("valveChangeDays", plan.valveChangeDays, 1, 31) ?? BAG_INTERVALS.valveDays.value;
  const useLegBag = optionalBoolean("legBag", plan.legBag) ?? true;
  const useValve = optionalBoolean("valve", plan.valve) ?? false;
  const useNightBag = optionalBoolean("nightBag", plan.nightBag) ?? true;
  const useGel = optionalBoolean("gel", plan.gel) ?? true;

  const first = optionalNumber("firstChangeInDays", plan.firstChangeInDays, 0, 366);
  if (first !== undefined && !Number.isInteger(first)) throw new ClinicalInputError("firstChangeInDays", "invalid", "must be whole days");

  const lines: SupplyLine[] = [];
  // Changes on days first, first + change, … that fall inside the period (days 0 to days − 1).
  const catheters = first === undefined ? Math.ceil(days / change) : first < days ? 1 + Math.floor((days - 1 - first) / change) : 0;
  lines.push({ item: "catheter", quantity: catheters + spares, intervalDays: change, spares, source: "common-practice" });
  if (useLegBag) {
    lines.push({ item: "leg-bag", quantity: Math.ceil(days / legBagDays), intervalDays: legBagDays, spares: 0, source: BAG_INTERVALS.legBagDays.source });
  }
  if (useValve) {
    lines.push({ item: "valve", quantity: Math.ceil(days / valveDays), intervalDays: valveDays, spares: 0, source: BAG_INTERVALS.valveDays.source });
  }
  if (useNightBag) {
    lines.push({ item: "night-bag", quantity: days, intervalDays: 1, spares: 0, source: BAG_INTERVALS.nightBagDays.source });
  }
  if (useGel) {
    lines.push({ item: "gel", quantity: catheters + spares, intervalDays: change, spares, source: "common-practice" });
  }
  return { days, lines };
}

export const BAG_KINDS = ["leg-bag", "valve"] as const;
export type BagKind = (typeof BAG_KINDS)[number];

export interface BagInUse {
  kind: BagKind;
  /** YYYY-MM-DD the bag or valve was last changed. */
  lastChangedOn: string;
  /** Override of the 7-day interval (maker or local policy). */
  intervalDays?: number;
}

export interface BagChange {
  kind: BagKind;
  nextOn: string;
  daysUntil: number;
  state: "ok" | "due-today" | "overdue";
  intervalDays: number;
  source: SourceId;
}

/**
 * When the leg bag or valve is next due (every 7 days unless overridden), for the
 * patient's Today page. Night bags are single use: a new one each night.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function nextBagChange(bag: BagInUse, today?: DateInput): BagChange {
  const kind = requireOneOf("kind", bag?.kind, ["leg-bag", "valve"] as const);
  const last = parseIsoDate("lastChangedOn", bag.lastChangedOn);
  const fallback = kind === "leg-bag" ? BAG_INTERVALS.legBagDays : BAG_INTERVALS.valveDays;
  const interval = optionalNumber("intervalDays", bag.intervalDays, 1, 31) ?? fallback.value;
  const next = last + interval;
  const daysUntil = next - toDayNumber("today", today);
  return {
    kind,
    nextOn: dayNumberToIso(next),
    daysUntil,
    state: daysUntil < 0 ? "overdue" : daysUntil === 0 ? "due-today" : "ok",
    intervalDays: interval,
    source: bag.intervalDays === undefined ? fallback.source : "common-practice",
  };
}

/**
 * nextBagChange for each bag in use, soonest first.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function bagSchedule(bags: readonly BagInUse[], today?: DateInput): BagChange[] {
  if (!Array.isArray(bags)) throw new ClinicalInputError("bags", "missing", "bags must be a list");
  return bags.map((b) => nextBagChange(b, today)).sort((a, b) => a.daysUntil - b.daysUntil);
}
