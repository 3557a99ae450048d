import { parseIsoDate } from "./dates";
import { ClinicalInputError, optionalNumber } from "./errors";
import type { SourceId } from "./sources";

export const END_REASONS = ["planned", "blockage", "bypassing", "expelled", "removed", "other"] as const;
export type EndReason = (typeof END_REASONS)[number];

export interface CatheterHistoryEntry {
  insertedOn: string;
  removedOn?: string;
  endReason?: EndReason;
}

export interface BlockagePatternOptions {
  /** Blockage episodes needed before a pattern is claimed (default 3). */
  minEpisodes?: number;
  /** Days before the typical blockage to plan the change (default 3). */
  marginDays?: number;
  /** Never suggest a shorter interval than this (default 7 days). */
  floorDays?: number;
  /** Never suggest longer than the maker's maximum dwell. */
  maxDwellDays?: number;
}

export type BlockagePattern =
  | { status: "insufficient"; blockageEpisodes: number; needed: number }
  | {
      status: "pattern";
      blockageEpisodes: number;
      /** Median dwell of catheters that ended in blockage. */
      typicalDwellDays: number;
      shortestDwellDays: number;
      longestDwellDays: number;
      suggestedIntervalDays: number;
      /** True when the floor, not the pattern, set the interval: seek specialist advice. */
      atFloor: boolean;
      source: SourceId;
    };

export const BLOCKAGE_DEFAULTS = {
  minEpisodes: { value: 3, source: "common-practice" },
  marginDays: { value: 3, source: "common-practice" },
  floorDays: { value: 7, source: "common-practice" },
} as const satisfies Record<string, { value: number; source: SourceId }>;

function median(sorted: number[]): number {
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * Typical catheter life from unplanned changes for blockage, and a planned-change interval
 * a few days shorter (never below a floor, never above the maker's maximum). Fewer than
 * three blockage episodes → "insufficient". Common practice, no source.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function blockagePattern(history: readonly CatheterHistoryEntry[], options: BlockagePatternOptions = {}): BlockagePattern {
  if (!Array.isArray(history)) throw new ClinicalInputError("history", "missing", "history must be a list");
  const needed = optionalNumber("minEpisodes", options.minEpisodes, 1, 100) ?? BLOCKAGE_DEFAULTS.minEpisodes.value;
  const margin = optionalNumber("marginDays", options.marginDays, 0, 60) ?? BLOCKAGE_DEFAULTS.marginDays.value;
  const floor = optionalNumber("floorDays", options.floorDays, 1, 366) ?? BLOCKAGE_DEFAULTS.floorDays.value;
  const cap = optionalNumber("maxDwellDays", options.maxDwellDays, 1, 366);

  const dwells: number[] = [];
  history.forEach((entry, i) => {
    if (entry.endReason !== "blockage") return;
    if (entry.removedOn === undefined) throw new ClinicalInputError(`history[${i}].removedOn`, "missing", "a blocked catheter needs its removal date");
    const days = parseIsoDate(`history[${i}].removedOn`, entry.removedOn) - parseIsoDate(`history[${i}].insertedOn`, entry.insertedOn);
    if (days < 0) throw new ClinicalInputError(`history[${i}].removedOn`, "invalid", "is before the insertion date");
    dwells.push(days);
  });
  if (dwells.length < needed) return { status: "insufficient", blockageEpisodes: dwells.length, needed };

  dwells.sort((a, b) => a - b);
  const typical = median(dwells);
  let suggested = Math.floor(typical - margin);
  if (cap !== undefined) suggested = Math.min(suggested, cap);
  const atFloor = suggested < floor;
  if (atFloor) suggested = floor;
  return {
    status: "pattern",
    blockageEpisodes: dwells.length,
    typicalDwellDays: typical,
    shortestDwellDays: dwells[0],
    longestDwellDays: dwells[dwells.length - 1],
    suggestedIntervalDays: suggested,
    atFloor,
    source: "common-practice",
  };
}
