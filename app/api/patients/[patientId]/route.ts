import { getPatientRecord, updatePatient } from "@/db/queries/patients";
import { requireRole, requireStaffPatientAccess } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";
import { writeRecord } from "@/lib/records/record-state";
import { parseJsonBody } from "@/lib/http/validate";
import { patientUpdateSchema } from "@/lib/validations/patient";

type Ctx = { params: Promise<{ patientId: string }> };

/** The patient's details, care team and the catheter in place. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  await openPatientRecord({ viewer, patientId, action: "patient.view.details", request });
  const record = await getPatientRecord({ patientId });
  if (!record) throw new AppError("not_found");
  return json(record);
});

/** Edits the given details (any subset of the registration fields except the care team). */
export const PATCH = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  // Who may touch the record first, so a stranger learns nothing from a validation answer.
  await requireStaffPatientAccess(viewer, patientId);
  const input = await parseJsonBody(request, patientUpdateSchema);
  await writeRecord(patientId, async (tx) => {
    const via = await openPatientRecord({ viewer, patientId, action: "patient.update", request, details: { fields: Object.keys(input) } }, tx);
    // Visit access is for seeing the record and adding a visit, not for changing who the patient is.
    if (via !== "care_team") throw new AppError("forbidden");
    await updatePatient({ patientId, input }, tx);
  });
  const record = await getPatientRecord({ patientId });
  return json(record);
});
