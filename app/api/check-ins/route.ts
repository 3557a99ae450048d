import { requirePortalPatient, requirePortalViewer } from "@/lib/auth/permissions";
import { submitCheckIn } from "@/lib/portal/check-ins";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { checkInSchema } from "@/lib/validations/check-in";

// A check-in from the patient or a carer. 201 the first time; the same idempotency key again
// answers 200 with the first result and writes nothing.
export const POST = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = await parseJsonBody(request, checkInSchema);
  const via = await requirePortalPatient(viewer, input.patientId);
  const { created, checkIn, reasons } = await submitCheckIn({ viewer, via, ...input, request });
  return json({ checkIn, reasons }, { status: created ? 201 : 200 });
});
