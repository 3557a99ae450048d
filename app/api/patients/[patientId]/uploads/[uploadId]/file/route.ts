import { getUploadRow } from "@/db/queries/uploads";
import { audit } from "@/lib/records/audit";
import { isUuid, requireRole, requireStaffPatientAccess } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle } from "@/lib/http/handle";
import { getObjectStream } from "@/lib/storage";
import { dayIn } from "@/lib/shared/time-zone";
import { downloadName } from "@/lib/records/uploads";

type Ctx = { params: Promise<{ patientId: string; uploadId: string }> };

/**
 * The file, streamed through the app (the store is never exposed): a download with a
 * server-set name and the type verified at upload (ASVS 5.4.1, 3.4.4). `?inline=1` shows an
 * image in place for thumbnails, still nosniff and sandboxed by its own CSP.
 */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId, uploadId } = await params;
  const viewer = await requireRole(request, "clinician");
  const via = await requireStaffPatientAccess(viewer, patientId);
  if (!isUuid(uploadId)) throw new AppError("not_found");
  const row = await getUploadRow({ patientId, uploadId });
  if (!row || row.status !== "ready" || !row.contentType) throw new AppError("not_found");
  const inline = new URL(request.url).searchParams.get("inline") === "1" && row.contentType.startsWith("image/");
  await audit({ action: "upload.download", actor: viewer, patientId, via, request, details: { uploadId, inline } });
  const object = await getObjectStream({ key: row.objectKey });
  if (!object) throw new AppError("not_found", "The file is missing from storage.");
  const name = downloadName(row, dayIn(row.createdAt));
  const headers = new Headers({
    "Content-Type": row.contentType,
    "Content-Disposition": `${inline ? "inline" : "attachment"}; filename="${name}"`,
    "X-Content-Type-Options": "nosniff",
    "Cache-Control": "private, no-store",
    "Content-Security-Policy": "sandbox; default-src 'none'; img-src 'self'",
    "Cross-Origin-Resource-Policy": "same-origin",
  });
  if (object.size !== undefined) headers.set("Content-Length", String(object.size));
  return new Response(object.body, { status: 200, headers });
});
