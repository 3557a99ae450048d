import "server-only";
// A closed record is kept read-only for the retention period. Every write to a patient's record
// calls assertRecordOpen inside its transaction, before writing.
import { eq } from "drizzle-orm";
import type { Executor } from "@/db";
import { patients } from "@/db/schema";
import { AppError } from "@/lib/http/errors";

/**
 * Throws 409 `record_closed` when the patient's record is closed (404 when there is no such
 * patient). Takes a share lock on the patient row, so a close running at the same moment waits
 * for this write or this write sees the close.
 */
export async function assertRecordOpen(tx: Executor, patientId: string): Promise<void> {
  const [row] = await tx.select({ closedAt: patients.closedAt }).from(patients).where(eq(patients.id, patientId)).for("share");
  if (!row) throw new AppError("not_found");
  if (row.closedAt) throw new AppError("record_closed");
}
