import { isUuid, requireCareTeam, requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle } from "@/lib/http/handle";
import { removeUpload } from "@/lib/records/uploads";

type Ctx = { params: Promise<{ patientId: string; uploadId: string }> };

/** Takes a photo or document off the record; the bytes are deleted from the store. Care team only. */
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { patientId, uploadId } = await params;
  const viewer = await requireRole(request, "clinician");
  const via = await requireCareTeam(viewer, patientId);
  if (!isUuid(uploadId)) throw new AppError("not_found");
  await removeUpload({ viewer, patientId, via, uploadId, request });
  return new Response(null, { status: 204 });
});
