import { listUploads } from "@/db/queries/uploads";
import { requireRole, requireUploadAccess, requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";
import { createUpload } from "@/lib/records/uploads";
import { parseJsonBody } from "@/lib/http/validate";
import { uploadCreateSchema } from "@/lib/validations/upload";

type Ctx = { params: Promise<{ patientId: string }> };

/** The patient's photos and documents, newest first. Staff only. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  await openPatientRecord({ viewer, patientId, action: "patient.view.uploads", request, details: { source: "api" } });
  return json({ uploads: await listUploads({ patientId }) });
});

/**
 * Declare an upload: category, label, type and size. Answers with a presigned PUT for a key
 * the server chose; the browser sends the file there, then calls …/complete.
 */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireUser(request);
  // Access is settled before the body is read; the category (for patients and carers) after.
  const via = await requireUploadAccess(viewer, patientId);
  const input = await parseJsonBody(request, uploadCreateSchema);
  await requireUploadAccess(viewer, patientId, input.category);
  const created = await createUpload({ viewer, patientId, via, input, request });
  return json(created, { status: 201 });
});
