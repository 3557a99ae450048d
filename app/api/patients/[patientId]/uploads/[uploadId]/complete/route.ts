import { isUuid, requireUploadAccess, requireUser } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { completeUpload } from "@/lib/records/uploads";

type Ctx = { params: Promise<{ patientId: string; uploadId: string }> };

/** The file is in the store: check its size and real type, then keep it or remove it. */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId, uploadId } = await params;
  const viewer = await requireUser(request);
  const via = await requireUploadAccess(viewer, patientId);
  if (!isUuid(uploadId)) throw new AppError("not_found");
  return json({ upload: await completeUpload({ viewer, patientId, via, uploadId, request }) });
});
