import "server-only";
import { and, asc, eq, inArray, isNull, sql } from "drizzle-orm";
import { db } from "@/db";
import { careTeam, catheterEpisodes, patients } from "@/db/schema";

export type CaseloadRow = {
  patientId: string;
  name: string;
  route: string | null;
  sizeCh: number | null;
  insertedAt: Date | null;
  plannedChangeOn: string | null;
  reviewDueOn: string | null;
  latestCheckInLevel: string | null;
};

/** Patients whose care team includes one of the organisations, with the catheter in place. One query. */
export async function listCaseload({ organisationIds, limit = 50 }: { organisationIds: string[]; limit?: number }) {
  if (organisationIds.length === 0) return [] as CaseloadRow[];
  const inTeam = db
    .selectDistinct({ patientId: careTeam.patientId })
    .from(careTeam)
    .where(inArray(careTeam.organisationId, organisationIds));
  return db
    .select({
      patientId: patients.id,
      name: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
      route: catheterEpisodes.route,
      sizeCh: catheterEpisodes.sizeCh,
      insertedAt: catheterEpisodes.insertedAt,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
      reviewDueOn: catheterEpisodes.reviewDueOn,
      latestCheckInLevel: patients.latestCheckInLevel,
    })
    .from(patients)
    .leftJoin(catheterEpisodes, and(eq(catheterEpisodes.patientId, patients.id), isNull(catheterEpisodes.removedAt)))
    .where(and(inArray(patients.id, inTeam), isNull(patients.closedAt)))
    .orderBy(asc(catheterEpisodes.plannedChangeOn), asc(patients.familyName))
    .limit(limit);
}
