import { requireCareTeam, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { addCareTeamOrganisation, changeLead } from "@/lib/records/referrals";
import { careTeamAddSchema, careTeamLeadSchema } from "@/lib/validations/referrals";

type Ctx = { params: Promise<{ patientId: string }> };

/** Adds a ward or community team to the care team, with a reason. */
export const POST = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId } = await params;
  await requireCareTeam(viewer, patientId);
  const input = await parseJsonBody(request, careTeamAddSchema);
  return json(await addCareTeamOrganisation({ patientId, ...input }, { viewer, request }), { status: 201 });
});

/** Makes another team of the care team its lead, with a reason. */
export const PATCH = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId } = await params;
  await requireCareTeam(viewer, patientId);
  const input = await parseJsonBody(request, careTeamLeadSchema);
  return json(await changeLead({ patientId, organisationId: input.leadOrganisationId, reason: input.reason }, { viewer, request }));
});
