import "server-only";
import { and, eq, isNull, lt, or } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { catheterEpisodes, checkIns, patients, type CheckIn } from "@/db/schema";

export type CheckInDto = {
  id: string;
  patientId: string;
  level: CheckIn["level"];
  ruleIds: string[];
  answers: Record<string, unknown>;
  answeredAt: string | null;
  createdAt: string;
};

export function toCheckInDto(row: CheckIn): CheckInDto {
  return {
    id: row.id,
    patientId: row.patientId,
    level: row.level,
    ruleIds: row.ruleIds,
    answers: row.answers,
    answeredAt: row.answeredAt ? row.answeredAt.toISOString() : null,
    createdAt: row.createdAt.toISOString(),
  };
}

/** The route of the catheter in place, for route-specific check-in rules. */
export async function getActiveRoute({ patientId }: { patientId: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ route: catheterEpisodes.route })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
  return row?.route ?? null;
}

/** Inserts unless the idempotency key is known; null when it was (the caller reads the first). */
export async function insertCheckIn(
  values: { patientId: string; reportedByUserId: string; answers: Record<string, unknown>; level: CheckIn["level"]; ruleIds: string[]; idempotencyKey: string; answeredAt: Date | null },
  tx: Executor = db,
) {
  const [row] = await tx.insert(checkIns).values(values).onConflictDoNothing({ target: checkIns.idempotencyKey }).returning();
  return row ?? null;
}

export async function getCheckInByKey({ idempotencyKey }: { idempotencyKey: string }, tx: Executor = db) {
  const [row] = await tx.select().from(checkIns).where(eq(checkIns.idempotencyKey, idempotencyKey));
  return row ?? null;
}

/** Keeps the caseload's latest level; a check-in answered earlier than the latest does not replace it. */
export async function setLatestCheckIn(
  { patientId, level, at }: { patientId: string; level: CheckIn["level"]; at: Date },
  tx: Executor = db,
) {
  await tx
    .update(patients)
    .set({ latestCheckInLevel: level, latestCheckInAt: at })
    .where(and(eq(patients.id, patientId), or(isNull(patients.latestCheckInAt), lt(patients.latestCheckInAt, at))));
}

