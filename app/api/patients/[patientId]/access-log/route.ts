import { listAccessLog } from "@/db/queries/audit-log";
import { requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { accessLogQuerySchema } from "@/lib/validations/audit";

type Ctx = { params: Promise<{ patientId: string }> };

/** Who opened or changed this record, newest first; for the care team only. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  const { page, pageSize, who } = parseInput(accessLogQuerySchema, searchParamsObject(request.url));
  const via = await openPatientRecord({ viewer, patientId, action: "patient.view.access-log", request, details: { source: "api", page } });
  if (via !== "care_team") throw new AppError("forbidden");
  return json(await listAccessLog({ patientId, page, pageSize, filter: who }));
});
