import { isUuid, requireOwnCareTeamOrganisation, requireUser } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { leaveCareTeam } from "@/lib/records/referrals";
import { careTeamLeaveSchema } from "@/lib/validations/referrals";

/** A clinician takes their own team off the care team, with a reason, while another team remains. */
export const DELETE = handle<{ params: Promise<{ patientId: string; organisationId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId, organisationId } = await params;
  if (!isUuid(organisationId)) throw new AppError("not_found");
  await requireOwnCareTeamOrganisation(viewer, patientId, organisationId);
  const { reason } = await parseJsonBody(request, careTeamLeaveSchema);
  return json(await leaveCareTeam({ patientId, organisationId, reason }, { viewer, request }));
});
