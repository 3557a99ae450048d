import "server-only";
// Caseload items: alerts to acknowledge and sample results to chase. Rows and reads only; who may
// see or close them is decided in lib/records/caseload-items.ts.
import { and, asc, desc, eq, inArray, isNotNull, isNull, lte, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, caseloadItems, checkIns, patients, user, type CaseloadItem } from "@/db/schema";

export type NewCaseloadItem = typeof caseloadItems.$inferInsert;

/** One item per check-in or observation: a second insert for the same source does nothing. */
export async function insertCaseloadItem({ values }: { values: NewCaseloadItem }, tx: Executor) {
  const [row] = await tx.insert(caseloadItems).values(values).onConflictDoNothing().returning();
  return row ?? null;
}

export async function getCaseloadItem({ patientId, itemId }: { patientId: string; itemId: string }, tx: Executor = db) {
  const [row] = await tx
    .select()
    .from(caseloadItems)
    .where(and(eq(caseloadItems.id, itemId), eq(caseloadItems.patientId, patientId)))
    .for("update");
  return row ?? null;
}

export async function closeCaseloadItem(
  { itemId, values }: { itemId: string; values: Pick<CaseloadItem, "closedAt" | "closedByUserId" | "closedByName" | "action" | "note"> },
  tx: Executor,
) {
  const [row] = await tx
    .update(caseloadItems)
    .set(values)
    .where(and(eq(caseloadItems.id, itemId), isNull(caseloadItems.closedAt)))
    .returning();
  return row ?? null;
}

export type OpenItemRow = CaseloadItem & { givenName: string; familyName: string; healthRecordNumber: string };

/** Open items of open records whose care team includes one of these organisations, oldest first. */
export async function listOpenItems({ organisationIds }: { organisationIds: string[] }, tx: Executor = db): Promise<OpenItemRow[]> {
  if (organisationIds.length === 0) return [];
  const rows = await tx
    .select({ i: caseloadItems, givenName: patients.givenName, familyName: patients.familyName, healthRecordNumber: patients.healthRecordNumber })
    .from(caseloadItems)
    .innerJoin(patients, eq(patients.id, caseloadItems.patientId))
    .where(
      and(
        isNull(caseloadItems.closedAt),
        isNull(patients.closedAt),
        inArray(caseloadItems.patientId, tx.selectDistinct({ id: careTeam.patientId }).from(careTeam).where(inArray(careTeam.organisationId, organisationIds))),
      ),
    )
    .orderBy(asc(caseloadItems.createdAt))
    .limit(200);
  return rows.map((r) => ({ ...r.i, givenName: r.givenName, familyName: r.familyName, healthRecordNumber: r.healthRecordNumber }));
}

/** Alerts past their acknowledgement time that have not been sent again yet. */
export async function listItemsDueForReminder({ now }: { now: Date }, tx: Executor = db) {
  return tx
    .select()
    .from(caseloadItems)
    .innerJoin(patients, eq(patients.id, caseloadItems.patientId))
    .where(and(isNull(caseloadItems.closedAt), isNull(caseloadItems.resentAt), isNotNull(caseloadItems.dueAt), lte(caseloadItems.dueAt, now), isNull(patients.closedAt)))
    .orderBy(asc(caseloadItems.dueAt))
    .limit(100)
    .then((rows) => rows.map((r) => r.caseload_items));
}

/** Marks an item sent again, once (the row lock makes two workers agree). */
export async function markItemResent({ itemId, at }: { itemId: string; at: Date }, tx: Executor) {
  const [row] = await tx
    .update(caseloadItems)
    .set({ resentAt: at })
    .where(and(eq(caseloadItems.id, itemId), isNull(caseloadItems.resentAt), isNull(caseloadItems.closedAt)))
    .returning({ id: caseloadItems.id });
  return Boolean(row);
}

/**
 * The patient's check-ins, newest first, with who answered and, for those that alerted, whether and
 * when the team saw it: Today's latest few and the portal's check-in history.
 */
export async function listCheckInsWithAcknowledgement({ patientId, limit = 5 }: { patientId: string; limit?: number }, tx: Executor = db) {
  const rows = await tx
    .select({
      id: checkIns.id,
      level: checkIns.level,
      answeredAt: checkIns.answeredAt,
      createdAt: checkIns.createdAt,
      reportedByUserId: checkIns.reportedByUserId,
      reporterName: user.name,
      itemId: caseloadItems.id,
      closedAt: caseloadItems.closedAt,
    })
    .from(checkIns)
    .leftJoin(caseloadItems, eq(caseloadItems.checkInId, checkIns.id))
    .leftJoin(user, eq(user.id, checkIns.reportedByUserId))
    .where(eq(checkIns.patientId, patientId))
    .orderBy(desc(sql`coalesce(${checkIns.answeredAt}, ${checkIns.createdAt})`))
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    level: r.level,
    at: r.answeredAt ?? r.createdAt,
    reportedByUserId: r.reportedByUserId,
    reporterName: r.reporterName,
    alerted: r.itemId !== null,
    seenAt: r.closedAt,
  }));
}
