import "server-only";
import { and, asc, eq, ilike, inArray, isNotNull, isNull, lt, or, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { tablesWithPatientId } from "@/db/queries/patient-export";
import { careTeam, carerLinks, passports, patients, uploads, user } from "@/db/schema";

const like = (s: string) => `%${s.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** Patients of the admin's organisations (name, HRN, closed or not), for data requests and closing. */
export async function listPatientsForAdmin({ organisationIds, q, limit = 50 }: { organisationIds: string[]; q?: string; limit?: number }) {
  if (organisationIds.length === 0) return [];
  return db
    .select({
      id: patients.id,
      name: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
      healthRecordNumber: patients.healthRecordNumber,
      closedAt: patients.closedAt,
    })
    .from(patients)
    .where(
      and(
        inArray(patients.id, db.select({ id: careTeam.patientId }).from(careTeam).where(inArray(careTeam.organisationId, organisationIds))),
        q
          ? or(ilike(patients.healthRecordNumber, like(q)), ilike(sql`${patients.givenName} || ' ' || ${patients.familyName}`, like(q)))
          : undefined,
      ),
    )
    .orderBy(asc(patients.familyName), asc(patients.givenName))
    .limit(limit);
}

/** Locks the patient row and returns what closing needs. */
export async function lockPatient({ patientId }: { patientId: string }, tx: Executor) {
  const [row] = await tx
    .select({ id: patients.id, closedAt: patients.closedAt, hrn: patients.healthRecordNumber, userId: patients.userId })
    .from(patients)
    .where(eq(patients.id, patientId))
    .for("update");
  return row ?? null;
}

export async function closePatient({ patientId, at }: { patientId: string; at: Date }, tx: Executor) {
  await tx.update(patients).set({ closedAt: at }).where(eq(patients.id, patientId));
  // The QR device card of a closed record stops working.
  const revoked = await tx
    .update(passports)
    .set({ revokedAt: at })
    .where(and(eq(passports.patientId, patientId), isNull(passports.revokedAt)))
    .returning({ id: passports.id });
  return { passportsRevoked: revoked.length };
}

/** Closed records whose retention period has ended. */
export async function listRecordsPastRetention({ closedBefore }: { closedBefore: Date }, tx: Executor = db) {
  return tx
    .select({ id: patients.id })
    .from(patients)
    .where(and(isNotNull(patients.closedAt), lt(patients.closedAt, closedBefore)))
    .orderBy(asc(patients.closedAt));
}

/**
 * Removes a patient's record: the rows of EVERY table with a patient_id (found from the schema, so
 * a new table is covered; audit events too — the record's access log goes with the record, and
 * the removal itself is logged by the caller), the patient row, and the patient's own account
 * (its sessions, credentials and second factor go with it). Returns the rows removed per table.
 * Nothing of the patient may be left: that is checked before the transaction commits.
 */
export async function removePatientRecord({ patientId, userId }: { patientId: string; userId: string | null }, tx: Executor) {
  const objects = await tx.select({ key: uploads.objectKey }).from(uploads).where(eq(uploads.patientId, patientId));
  const carers = await tx.selectDistinct({ id: carerLinks.carerUserId }).from(carerLinks).where(and(eq(carerLinks.patientId, patientId), isNotNull(carerLinks.carerUserId)));
  const tables = tablesWithPatientId();
  const rows: Record<string, number> = {};
  // Counted first: deleting one table may cascade into another.
  for (const { name, table, column } of tables) {
    const [{ n }] = await tx.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(column, patientId));
    rows[name] = n;
  }
  for (const { table, column } of tables) await tx.delete(table).where(eq(column, patientId));
  await tx.delete(patients).where(eq(patients.id, patientId));
  rows.patients = 1;
  if (userId) {
    const gone = await tx.delete(user).where(and(eq(user.id, userId), eq(user.role, "patient"))).returning({ id: user.id });
    rows.user = gone.length;
  }
  // A carer account exists only to look after someone: once it looks after nobody (no link to
  // another patient, in any state), it goes with the record. Its sessions cascade.
  const carerIds = carers.map((c) => c.id).filter((id): id is string => id !== null);
  if (carerIds.length > 0) {
    const gone = await tx
      .delete(user)
      .where(
        and(
          inArray(user.id, carerIds),
          eq(user.role, "carer"),
          sql`not exists (select 1 from ${carerLinks} where ${carerLinks.carerUserId} = ${user.id})`,
        ),
      )
      .returning({ id: user.id });
    rows.carer_accounts = gone.length;
  }
  for (const { name, table, column } of tables) {
    const [{ n }] = await tx.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(column, patientId));
    if (n !== 0) throw new Error(`retention: ${n} row(s) of ${name} left for a removed record`);
  }
  return { objectKeys: objects.map((o) => o.key), rows };
}
