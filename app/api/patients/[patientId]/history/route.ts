import { getPatientHistory } from "@/db/queries/history";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";

type Ctx = { params: Promise<{ patientId: string }> };

/** Every episode and event, newest first, with the blockage pattern from lib/clinical. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  await openPatientRecord({ viewer, patientId, action: "patient.view.history", request, details: { source: "api" } });
  return json(await getPatientHistory({ patientId }));
});
