import "server-only";
// A closed record is kept read-only for the retention period. Every write to a patient's record
// goes through writeRecord (or calls assertRecordOpen inside its own transaction), so a closed
// record answers one error everywhere: 409 `record_closed`.
// tests/integration/closed-record.test.ts finds every write route on disk and tries each one.
import { eq } from "drizzle-orm";
import { db, type Executor, type Transaction } from "@/db";
import { patients } from "@/db/schema";
import { AppError } from "@/lib/http/errors";

/**
 * Throws 409 `record_closed` when the patient's record is closed (404 when there is no such
 * patient). Locks the patient row for the rest of the transaction, so a close running at the same
 * moment waits for this write or this write sees the close. The lock is "no key update", not
 * "share": many writes then update the patient row (the latest check-in), and two share locks
 * both upgrading would deadlock; writes to one record go one after the other instead.
 */
export async function assertRecordOpen(tx: Executor, patientId: string): Promise<void> {
  const [row] = await tx.select({ closedAt: patients.closedAt }).from(patients).where(eq(patients.id, patientId)).for("no key update");
  if (!row) throw new AppError("not_found");
  if (row.closedAt) throw new AppError("record_closed");
}

/** One write to a patient's record: a transaction that refuses a closed record before anything else. */
export function writeRecord<T>(patientId: string, write: (tx: Transaction) => Promise<T>): Promise<T> {
  return db.transaction(async (tx) => {
    await assertRecordOpen(tx, patientId);
    return write(tx);
  });
}
