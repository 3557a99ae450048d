import { requireCareTeam, requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { createPatientInvite } from "@/lib/portal/invitations";
import { parseJsonBody } from "@/lib/http/validate";
import { patientInviteSchema } from "@/lib/validations/invitations";

// A care-team clinician makes a one-time activation code for the patient's portal account.
// The code is in this answer only (it is stored as an HMAC): show it, print it, give it.
export const POST = handle<{ params: Promise<{ patientId: string }> }>(async (request, { params }) => {
  const viewer = await requireRole(request, "clinician");
  const { patientId } = await params;
  await requireCareTeam(viewer, patientId);
  const input = await parseJsonBody(request, patientInviteSchema);
  const invite = await createPatientInvite({ viewer, patientId, email: input.email, request });
  return json(invite, { status: 201 });
});
