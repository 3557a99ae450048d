import { getReferral } from "@/db/queries/referrals";
import { isUuid, requireReferralReceiver, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { declineReferral } from "@/lib/records/referrals";
import { declineSchema } from "@/lib/validations/referrals";

/** The receiving team declines, with a reason that goes back to the referring team. */
export const POST = handle<{ params: Promise<{ referralId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { referralId } = await params;
  const referral = isUuid(referralId) ? await getReferral({ id: referralId }) : null;
  await requireReferralReceiver(viewer, referral);
  const { reason } = await parseJsonBody(request, declineSchema);
  return json(await declineReferral({ referralId, patientId: referral!.patientId, reason }, { viewer, request }));
});
