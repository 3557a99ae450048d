import { isUuid, requireCareTeam, requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { closeItem } from "@/lib/records/caseload-items";
import { acknowledgeSchema } from "@/lib/validations/caseload-item";

type Ctx = { params: Promise<{ patientId: string; itemId: string }> };

/** Acknowledge an alert with what was done, or mark a sample's result chased. The alert team only. */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId, itemId } = await params;
  const viewer = await requireRole(request, "clinician");
  await requireCareTeam(viewer, patientId);
  const input = await parseJsonBody(request, acknowledgeSchema);
  if (!isUuid(itemId)) throw new AppError("not_found");
  return json(await closeItem({ viewer, patientId, itemId, input, request }));
});
