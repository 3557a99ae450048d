import "server-only";
// Opening a patient's record as staff: the access check and the audit event together, so no
// view or change of a record can skip either (docs/security.md, access rules).
import type { Executor } from "@/db";
import { audit } from "@/lib/records/audit";
import { requireStaffPatientAccess } from "@/lib/auth/permissions";
import type { Viewer } from "@/lib/auth/session";

export async function openPatientRecord(
  {
    viewer,
    patientId,
    action,
    request,
    reason,
    details,
  }: {
    viewer: Viewer;
    patientId: string;
    /** e.g. "patient.view.history", "episode.create" */
    action: string;
    /** A Request in route handlers; `{ headers: await headers() }` in pages. */
    request?: Request | { headers: Headers } | null;
    reason?: string | null;
    details?: Record<string, unknown>;
  },
  tx?: Executor,
) {
  const via = await requireStaffPatientAccess(viewer, patientId);
  await audit({ action, actor: viewer, patientId, via, request, reason, details }, tx);
  return via;
}
