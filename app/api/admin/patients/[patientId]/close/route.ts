import { db } from "@/db";
import { closePatient, lockPatient } from "@/db/queries/admin-patients";
import { audit } from "@/lib/records/audit";
import { requireAdminOfPatient, requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { getSettings } from "@/lib/config/settings";
import { parseJsonBody } from "@/lib/http/validate";
import { closeRecordSchema } from "@/lib/validations/admin-patient";

/**
 * Closes a patient's record: from now on it is read-only (writes answer 409 `record_closed`), its
 * QR card stops working, and after the retention period the retention job removes it.
 */
export const POST = handle<{ params: Promise<{ patientId: string }> }>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { patientId } = await params;
  await requireAdminOfPatient(viewer, patientId);
  const { reason } = await parseJsonBody(request, closeRecordSchema);
  const { retentionDays } = await getSettings();
  const result = await db.transaction(async (tx) => {
    const row = await lockPatient({ patientId }, tx);
    if (!row) throw new AppError("not_found");
    if (row.closedAt) throw new AppError("record_closed", "This record is closed already.");
    const at = new Date();
    const { passportsRevoked } = await closePatient({ patientId, at }, tx);
    await audit({ action: "patient.close", actor: viewer, patientId, via: "admin", request, reason, details: { retentionDays, passportsRevoked } }, tx);
    return { closedAt: at, removeAfter: retentionDays === null ? null : new Date(at.getTime() + retentionDays * 86_400_000) };
  });
  return json({ patientId, ...result });
});
