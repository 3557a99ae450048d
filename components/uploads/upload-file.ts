// One upload, from the browser: declare it to the app, PUT the bytes straight to the store with
// the presigned URL, then ask the app to check them. Used by the record's Documents tab and by
// the portal's site photo, so both go through the same service and the same server checks.
import { MAX_UPLOAD_BYTES, type UploadCategory } from "@/lib/validations/upload";

export const ACCEPTED_UPLOAD_TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif", "application/pdf"] as const;
export const ACCEPTED_PHOTO_TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif"] as const;

export type UploadFailure = "too-big" | "wrong-type" | "failed";
export type UploadOutcome = { ok: true; uploadId: string } | { ok: false; reason: UploadFailure };

/** Checked in the browser first for a quick answer; the server checks the bytes again. */
export function precheck(file: File, accepted: readonly string[]): UploadFailure | null {
  if (file.size > MAX_UPLOAD_BYTES) return "too-big";
  if (!accepted.includes(file.type)) return "wrong-type";
  return null;
}

function failureOf(status: number): UploadFailure {
  if (status === 413) return "too-big";
  if (status === 415) return "wrong-type";
  return "failed";
}

export async function uploadFile({
  patientId,
  file,
  category,
  label,
}: {
  patientId: string;
  file: File;
  category: UploadCategory;
  label: string;
}): Promise<UploadOutcome> {
  try {
    const start = await fetch(`/api/patients/${patientId}/uploads`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ category, label, contentType: file.type, sizeBytes: file.size }),
    });
    if (!start.ok) return { ok: false, reason: failureOf(start.status) };
    const declared: { upload: { id: string }; uploadUrl: string; uploadHeaders: Record<string, string> } = await start.json();
    // Exactly the signed headers (the declared type): a second Content-Type would break the signature.
    const put = await fetch(declared.uploadUrl, { method: "PUT", headers: declared.uploadHeaders, body: file });
    if (!put.ok) return { ok: false, reason: "failed" };
    const done = await fetch(`/api/patients/${patientId}/uploads/${declared.upload.id}/complete`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: "{}",
    });
    if (!done.ok) return { ok: false, reason: failureOf(done.status) };
    return { ok: true, uploadId: declared.upload.id };
  } catch {
    return { ok: false, reason: "failed" };
  }
}
