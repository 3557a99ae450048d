// One upload, from the browser: declare it to the app, PUT the bytes straight to the store with
// the presigned URL, then ask the app to check them. Used by the record's Documents tab and by
// the portal's site photo, so both go through the same service and the same server checks.
import { apiFetch, isApiError } from "@/lib/browser/api-client";
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

function failureOf(error: unknown): UploadFailure {
  if (isApiError(error) && error.status === 413) return "too-big";
  if (isApiError(error) && error.status === 415) return "wrong-type";
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
    const declared = await apiFetch<{ upload: { id: string }; uploadUrl: string; uploadHeaders: Record<string, string> }>(`/api/patients/${patientId}/uploads`, {
      method: "POST",
      body: { category, label, contentType: file.type, sizeBytes: file.size },
    });
    // The bytes go to the object store, not to Caddis, so not through apiFetch: exactly the
    // signed headers (the declared type); a second Content-Type would break the signature.
    const put = await fetch(declared.uploadUrl, { method: "PUT", headers: declared.uploadHeaders, body: file });
    if (!put.ok) return { ok: false, reason: "failed" };
    await apiFetch(`/api/patients/${patientId}/uploads/${declared.upload.id}/complete`, { method: "POST", body: {} });
    return { ok: true, uploadId: declared.upload.id };
  } catch (error) {
    return { ok: false, reason: failureOf(error) };
  }
}
