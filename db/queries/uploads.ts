import "server-only";
// Uploads of one patient: rows and their explicit DTO (never the object key).
import { and, desc, eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { uploads, user, type Upload } from "@/db/schema";

export type UploadDto = {
  id: string;
  category: Upload["category"];
  label: string;
  contentType: string | null;
  sizeBytes: number | null;
  status: Upload["status"];
  createdAt: string;
  uploadedByName: string | null;
  /** Shown as a thumbnail (only verified images). */
  isImage: boolean;
};

function toDto(row: Upload & { uploadedByName?: string | null }): UploadDto {
  return {
    id: row.id,
    category: row.category,
    label: row.label,
    contentType: row.contentType,
    sizeBytes: row.sizeBytes,
    status: row.status,
    createdAt: row.createdAt.toISOString(),
    uploadedByName: row.uploadedByName ?? null,
    isImage: row.status === "ready" && Boolean(row.contentType?.startsWith("image/")),
  };
}

export async function insertUpload(
  values: { patientId: string; uploadedByUserId: string; category: Upload["category"]; objectKey: string; label: string; contentType: string; sizeBytes: number },
  tx: Executor,
): Promise<UploadDto> {
  const [row] = await tx.insert(uploads).values({ ...values, status: "pending" }).returning();
  return toDto(row);
}

/** One upload of one patient (the object key included, for the server only), or null. */
export async function getUploadRow({ patientId, uploadId }: { patientId: string; uploadId: string }, tx: Executor = db): Promise<Upload | null> {
  const [row] = await tx.select().from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.patientId, patientId)));
  return row ?? null;
}

export async function setUploadStatus(
  { uploadId, status, contentType, sizeBytes }: { uploadId: string; status: Upload["status"]; contentType?: string; sizeBytes?: number },
  tx: Executor,
): Promise<UploadDto> {
  const [row] = await tx
    .update(uploads)
    .set({ status, ...(contentType ? { contentType } : {}), ...(sizeBytes ? { sizeBytes } : {}) })
    .where(eq(uploads.id, uploadId))
    .returning();
  return toDto(row);
}

export async function listUploads({ patientId }: { patientId: string }, tx: Executor = db): Promise<UploadDto[]> {
  const rows = await tx
    .select({ upload: uploads, uploadedByName: user.name })
    .from(uploads)
    .leftJoin(user, eq(user.id, uploads.uploadedByUserId))
    .where(eq(uploads.patientId, patientId))
    .orderBy(desc(uploads.createdAt));
  return rows.map((r) => toDto({ ...r.upload, uploadedByName: r.uploadedByName }));
}

export { toDto as uploadDto };
