import { listPatientMessages } from "@/db/queries/outbox";
import { requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";

type Ctx = { params: Promise<{ patientId: string }> };

/** Every outbound message about the patient (the Letters tab), newest first. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireUser(request);
  await openPatientRecord({ viewer, patientId, action: "patient.view.letters", request, details: { source: "api" } });
  return json({ messages: await listPatientMessages({ patientId }) });
});
