import { requireCareTeam, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { saveDischargeChecklist } from "@/lib/records/referrals";
import { dischargeChecklistSchema } from "@/lib/validations/referrals";

/** Records the discharge checklist on its own (it can also travel with a referral). */
export const POST = handle<{ params: Promise<{ patientId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId } = await params;
  await requireCareTeam(viewer, patientId);
  const values = await parseJsonBody(request, dischargeChecklistSchema);
  return json(await saveDischargeChecklist({ patientId, values }, { viewer, request }), { status: 201 });
});
