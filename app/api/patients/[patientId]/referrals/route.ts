import { getLatestDischargeChecklist, listPatientReferrals } from "@/db/queries/referrals";
import { requireCareTeam, requireStaffPatientAccess, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { createReferral } from "@/lib/records/referrals";
import { referralSchema } from "@/lib/validations/referrals";

type Ctx = { params: Promise<{ patientId: string }> };

/** The patient's referrals (newest first) and the latest discharge checklist. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId } = await params;
  await requireStaffPatientAccess(viewer, patientId);
  const [referrals, checklist] = await Promise.all([listPatientReferrals({ patientId }), getLatestDischargeChecklist({ patientId })]);
  return json({ referrals, checklist });
});

/** Refers the patient to another ward or community team, with the handover note (and the discharge checklist). */
export const POST = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId } = await params;
  await requireCareTeam(viewer, patientId);
  const input = await parseJsonBody(request, referralSchema);
  return json(await createReferral({ patientId, input }, { viewer, request }), { status: 201 });
});
