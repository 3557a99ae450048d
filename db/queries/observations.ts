import "server-only";
// NEWS2 observations: the rows and what the record shows of them.
import { and, desc, eq, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { episodeEvents, observations, type NewObservation, type Observation } from "@/db/schema";
import type { News2Observations } from "@/lib/clinical";
import { visitFindingsSchema, type VisitFindings } from "@/lib/validations/visit";

export type ObservationDto = {
  id: string;
  eventId: string | null;
  takenAt: string;
  values: News2Observations;
  news2: { total: number; subscores: Record<string, number>; risk: Observation["news2Risk"]; response: Observation["news2Response"] };
  recordedByName: string;
};

export function toObservationDto(o: Observation): ObservationDto {
  return {
    id: o.id,
    eventId: o.eventId,
    takenAt: o.takenAt.toISOString(),
    values: {
      respirationRate: o.respirationRate,
      spo2: o.spo2,
      spo2Scale: o.spo2Scale === 2 ? 2 : 1,
      onOxygen: o.onOxygen,
      systolicBp: o.systolicBp,
      pulse: o.pulse,
      consciousness: o.consciousness,
      temperatureC: Number(o.temperatureC),
    },
    news2: { total: o.news2Total, subscores: o.news2Subscores, risk: o.news2Risk, response: o.news2Response },
    recordedByName: o.recordedByName,
  };
}

export async function insertObservation({ values }: { values: NewObservation }, tx: Executor) {
  const [row] = await tx.insert(observations).values(values).returning();
  return row;
}

export async function listObservations({ patientId, limit = 20 }: { patientId: string; limit?: number }, tx: Executor = db) {
  const rows = await tx
    .select()
    .from(observations)
    .where(eq(observations.patientId, patientId))
    .orderBy(desc(observations.takenAt), desc(observations.createdAt))
    .limit(limit);
  return rows.map(toObservationDto);
}

/** What the last structured visit found: the next visit form starts from it. */
export async function getLastVisitFindings({ patientId }: { patientId: string }, tx: Executor = db): Promise<VisitFindings | null> {
  const [row] = await tx
    .select({ details: episodeEvents.details })
    .from(episodeEvents)
    .where(and(eq(episodeEvents.patientId, patientId), eq(episodeEvents.kind, "visit"), sql`${episodeEvents.details} ? 'findings'`))
    .orderBy(desc(episodeEvents.occurredAt))
    .limit(1);
  const findings = (row?.details as { findings?: Record<string, unknown> } | undefined)?.findings;
  // The next visit's date is not carried over (it is in the past by now).
  const parsed = visitFindingsSchema.safeParse(findings ? { ...findings, nextVisitOn: undefined } : undefined);
  return parsed.success ? parsed.data : null;
}
