import { getPatientForInvite } from "@/db/queries/invitations";
import { requireCarerManager, requireUser } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { inviteCarer } from "@/lib/portal/invitations";
import { parseJsonBody } from "@/lib/http/validate";
import { carerInviteSchema } from "@/lib/validations/invitations";

export const POST = handle<{ params: Promise<{ patientId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId } = await params;
  const via = await requireCarerManager(viewer, patientId);
  const input = await parseJsonBody(request, carerInviteSchema);
  const patient = await getPatientForInvite({ patientId });
  if (!patient) throw new AppError("not_found");
  const invite = await inviteCarer({ viewer, via, patientId, email: input.email, locale: patient.preferredLocale, request });
  return json(invite, { status: 201 });
});
