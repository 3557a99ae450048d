import { requireCareTeam, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { withdrawReferral } from "@/lib/records/referrals";

/** The care team takes back a referral that is still waiting. */
export const POST = handle<{ params: Promise<{ patientId: string; referralId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId, referralId } = await params;
  await requireCareTeam(viewer, patientId);
  return json(await withdrawReferral({ patientId, referralId }, { viewer, request }));
});
