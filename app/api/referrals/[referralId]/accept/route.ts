import { getReferral } from "@/db/queries/referrals";
import { isUuid, requireReferralReceiver, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { acceptReferral } from "@/lib/records/referrals";

/** The receiving team accepts: it joins the care team and leads it. */
export const POST = handle<{ params: Promise<{ referralId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { referralId } = await params;
  const referral = isUuid(referralId) ? await getReferral({ id: referralId }) : null;
  await requireReferralReceiver(viewer, referral);
  return json(await acceptReferral({ referralId, patientId: referral!.patientId }, { viewer, request }));
});
