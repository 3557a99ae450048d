// A patient's blockage pattern from how their past catheters ended, read the same way by the
// change form (its hint) and the supply request (the interval supplies are planned on).
import { blockagePattern, type BlockagePattern, type EndReason } from "@/lib/clinical";
import { dayIn } from "./time-zone";

type Ending = { insertedAt: Date; removedAt: Date | null; removalReason: string | null };

/** The stored removal reason as the pattern reads it ("planned change" is a planned end). */
const endReasonOf = (r: string | null): EndReason | undefined =>
  r === null ? undefined : r === "planned change" ? "planned" : r === "blockage" || r === "bypassing" || r === "expelled" ? r : "other";

/** The pattern of these endings (calendar days in the deployment's zone), or null when it cannot be read. */
export function blockagePatternOf(endings: readonly Ending[], timeZone: string, maxDwellDays?: number): Extract<BlockagePattern, { status: "pattern" }> | null {
  try {
    const pattern = blockagePattern(
      endings.map((e) => ({ insertedOn: dayIn(e.insertedAt, timeZone), removedOn: e.removedAt ? dayIn(e.removedAt, timeZone) : undefined, endReason: endReasonOf(e.removalReason) })),
      { maxDwellDays },
    );
    return pattern.status === "pattern" ? pattern : null;
  } catch {
    return null;
  }
}
