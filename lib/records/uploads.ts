import "server-only";
// Photos and documents through a presigned upload. The browser declares what it will send, the
// server picks the object key and signs a PUT for exactly that type and size; once the bytes
// are in the store the server reads their start and decides from the bytes, not the name or
// the declared type, whether to keep them (ASVS 5.2.1, 5.2.2, 5.3.2).
import { randomUUID } from "node:crypto";
import { fileTypeFromBuffer } from "file-type";
import { db } from "@/db";
import { getUploadRow, insertUpload, markUploadRemoved, setUploadStatus, uploadDto, type UploadDto } from "@/db/queries/uploads";
import type { PatientAccessVia } from "@/db/queries/access";
import type { Upload } from "@/db/schema";
import { audit } from "@/lib/records/audit";
import { assertRecordOpen, writeRecord } from "@/lib/records/record-state";
import { requirePatientAccess, requireStaffPatientAccess } from "@/lib/auth/permissions";
import type { Viewer } from "@/lib/auth/session";
import { AppError } from "@/lib/http/errors";
import { deleteObject, getObjectHead, headObject, presignPut } from "@/lib/storage";
import { isAcceptedContentType, MAX_UPLOAD_BYTES, type UploadCreateValues } from "@/lib/validations/upload";

/** Bytes read back from the store to recognise the type (file-type needs at most 4100). */
const SNIFF_BYTES = 4100;

/**
 * Who may add files to this patient: staff through the care team (or visit access); the
 * patient themself or a linked carer, for site photos only (the portal reuses these routes).
 */
export async function requireUploadAccess(viewer: Viewer, patientId: string, category?: Upload["category"]): Promise<PatientAccessVia> {
  if (viewer.role === "clinician") return requireStaffPatientAccess(viewer, patientId);
  if (viewer.role === "patient" || viewer.role === "carer") {
    const via = await requirePatientAccess(viewer, patientId);
    if (category !== undefined && category !== "site-photo") {
      throw new AppError("forbidden", "Patients and carers can add site photos only.");
    }
    return via;
  }
  throw new AppError("forbidden");
}

/** Where a patient's uploaded files are stored (retention deletes everything under it). */
export function uploadPrefix(patientId: string): string {
  return `patients/${patientId}/`;
}

export type CreatedUpload = { upload: UploadDto; uploadUrl: string; uploadHeaders: Record<string, string>; expiresAt: string };

export async function createUpload({
  viewer,
  patientId,
  via,
  input,
  request,
}: {
  viewer: Viewer;
  patientId: string;
  via: PatientAccessVia;
  input: UploadCreateValues;
  request: Request;
}): Promise<CreatedUpload> {
  if (input.sizeBytes > MAX_UPLOAD_BYTES) {
    throw new AppError("payload_too_large", "Files can be up to 10 MB.", { fields: { sizeBytes: ["too_large"] } });
  }
  if (!isAcceptedContentType(input.contentType)) {
    throw new AppError("unsupported_media_type", "Use a JPEG, PNG, WebP or HEIC photo, or a PDF.", { fields: { contentType: ["bad_type"] } });
  }
  const objectKey = `${uploadPrefix(patientId)}${randomUUID()}`;
  const upload = await writeRecord(patientId, async (tx) => {
    const row = await insertUpload(
      {
        patientId,
        uploadedByUserId: viewer.userId,
        category: input.category,
        objectKey,
        label: input.label,
        contentType: input.contentType,
        sizeBytes: input.sizeBytes,
      },
      tx,
    );
    await audit(
      {
        action: "upload.create",
        actor: viewer,
        patientId,
        via,
        request,
        details: { uploadId: row.id, category: input.category, declaredType: input.contentType, declaredBytes: input.sizeBytes },
      },
      tx,
    );
    return row;
  });
  const signed = await presignPut({ key: objectKey, contentType: input.contentType, contentLength: input.sizeBytes });
  return { upload, uploadUrl: signed.url, uploadHeaders: signed.headers, expiresAt: signed.expiresAt.toISOString() };
}

/** HEIC and HEIF are one family; a phone may call either what file-type calls the other. */
function sameType(declared: string, detected: string): boolean {
  const family = (t: string) => (t === "image/heif" ? "image/heic" : t);
  return family(declared) === family(detected);
}

async function reject(
  { viewer, patientId, via, row, request, reason }: { viewer: Viewer; patientId: string; via: PatientAccessVia; row: Upload; request: Request; reason: string },
) {
  await deleteObject({ key: row.objectKey }).catch(() => {});
  await writeRecord(patientId, async (tx) => {
    await setUploadStatus({ uploadId: row.id, status: "rejected" }, tx);
    await audit({ action: "upload.reject", actor: viewer, patientId, via, request, details: { uploadId: row.id, reason } }, tx);
  });
}

/** The bytes have been PUT: verify size and real type, then keep (ready) or delete (rejected). */
export async function completeUpload({
  viewer,
  patientId,
  via,
  uploadId,
  request,
}: {
  viewer: Viewer;
  patientId: string;
  via: PatientAccessVia;
  uploadId: string;
  request: Request;
}): Promise<UploadDto> {
  // Refused before the store is touched: a closed record's files are neither kept nor removed.
  await assertRecordOpen(db, patientId);
  const row = await getUploadRow({ patientId, uploadId });
  // Patients and carers finish only what they started themselves.
  if (!row || ((viewer.role === "patient" || viewer.role === "carer") && row.uploadedByUserId !== viewer.userId)) {
    throw new AppError("not_found");
  }
  if (row.status === "ready") return uploadDto(row);
  if (row.status === "rejected") throw new AppError("conflict", "This upload was refused. Start a new one.");
  const head = await headObject({ key: row.objectKey });
  if (!head) throw new AppError("conflict", "The file has not arrived yet. Send it, then finish the upload.");
  if (head.size > MAX_UPLOAD_BYTES) {
    await reject({ viewer, patientId, via, row, request, reason: "too_large" });
    throw new AppError("payload_too_large", "Files can be up to 10 MB. The file was removed.");
  }
  const bytes = (await getObjectHead({ key: row.objectKey, maxBytes: SNIFF_BYTES })) ?? new Uint8Array();
  const detected = bytes.length ? await fileTypeFromBuffer(bytes) : undefined;
  if (!detected || !isAcceptedContentType(detected.mime) || !row.contentType || !sameType(row.contentType, detected.mime)) {
    await reject({ viewer, patientId, via, row, request, reason: detected ? `type:${detected.mime}` : "type:unknown" });
    throw new AppError("unsupported_media_type", "The file is not the JPEG, PNG, WebP, HEIC or PDF it said it was. It was removed.");
  }
  return writeRecord(patientId, async (tx) => {
    const dto = await setUploadStatus({ uploadId, status: "ready", contentType: detected.mime, sizeBytes: head.size }, tx);
    await audit(
      { action: "upload.complete", actor: viewer, patientId, via, request, details: { uploadId, type: detected.mime, bytes: head.size } },
      tx,
    );
    return dto;
  });
}

/**
 * Takes a file off the record (wrong patient, wrong file): the row is kept as "removed" with
 * its audit event, the bytes are deleted from the store after the transaction commits. Care
 * team only; the caller has checked.
 */
export async function removeUpload({
  viewer,
  patientId,
  via,
  uploadId,
  request,
}: {
  viewer: Viewer;
  patientId: string;
  via: PatientAccessVia;
  uploadId: string;
  request: Request;
}): Promise<void> {
  const row = await writeRecord(patientId, async (tx) => {
    const removed = await markUploadRemoved({ patientId, uploadId }, tx);
    if (!removed) throw new AppError("not_found");
    await audit(
      { action: "upload.remove", actor: viewer, patientId, via, request, details: { uploadId, category: removed.category, was: removed.status } },
      tx,
    );
    return removed;
  });
  // After the commit: a failed delete leaves bytes nobody can reach (the row says removed).
  await deleteObject({ key: row.objectKey }).catch(() => {});
}

/** A server-set download name (never the uploader's): caddis-discharge-letter-2026-05-03.pdf */
export function downloadName(row: Pick<Upload, "category" | "contentType" | "createdAt">, day: string): string {
  const ext: Record<string, string> = {
    "image/jpeg": "jpg",
    "image/png": "png",
    "image/webp": "webp",
    "image/heic": "heic",
    "image/heif": "heif",
    "application/pdf": "pdf",
  };
  return `caddis-${row.category}-${day}.${ext[row.contentType ?? ""] ?? "bin"}`;
}
