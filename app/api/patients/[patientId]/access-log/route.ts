import { listAccessLog } from "@/db/queries/audit-log";
import { requireAccessLogReader, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { accessLogQuerySchema } from "@/lib/validations/audit";

type Ctx = { params: Promise<{ patientId: string }> };

/** Who opened or changed this record, newest first; for the care team and the patient themselves. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireUser(request);
  const via = await requireAccessLogReader(viewer, patientId);
  const { page, pageSize, who, month } = parseInput(accessLogQuerySchema, searchParamsObject(request.url));
  // Staff reading the log is itself an access; the patient reading their own is not.
  if (via === "care_team") await openPatientRecord({ viewer, patientId, action: "patient.view.access-log", request, details: { source: "api", page } });
  return json(await listAccessLog({ patientId, page, pageSize, filter: who, month: month ?? null }));
});
