// Declaring an upload before the browser sends the bytes. Shared by the upload form and the
// route handler; messages are keys of Uploads.errors.
import { z } from "zod";
import { multiLine, singleLine } from "./text";

export const uploadCategories = ["packaging-label", "discharge-letter", "site-photo", "other"] as const;
export type UploadCategory = (typeof uploadCategories)[number];

/** The only types accepted, checked again from the bytes once they have arrived (ASVS 5.2.2). */
export const uploadContentTypes = ["image/jpeg", "image/png", "image/webp", "image/heic", "image/heif", "application/pdf"] as const;
export type UploadContentType = (typeof uploadContentTypes)[number];

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

export function isAcceptedContentType(type: string): type is UploadContentType {
  return (uploadContentTypes as readonly string[]).includes(type);
}

export const uploadCreateSchema = z
  .object({
    category: z.enum(uploadCategories, { error: "invalid" }),
    // Shown beside the file: one line, and no bidirectional override to make "x\u202Egnp.exe" read as a photo.
    label: singleLine(z.string({ error: "required" }).trim().min(1, { error: "required" }).max(120, { error: "too_long" })),
    // Checked against the accepted list by the handler (415, not 400), so any string passes here.
    contentType: z.string({ error: "required" }).trim().toLowerCase().min(1, { error: "required" }).max(100, { error: "invalid" }),
    // The limit itself is checked by the handler (413); here only a whole positive number.
    sizeBytes: z.number({ error: "invalid" }).int({ error: "invalid" }).positive({ error: "invalid" }),
  })
  .strict();

export type UploadCreateValues = z.infer<typeof uploadCreateSchema>;
