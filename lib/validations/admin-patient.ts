import { z } from "zod";
import { multiLine, singleLine } from "./text";

export const closeRecordSchema = z.object({
  reason: multiLine(z.string().trim().min(3, { message: "reason_required" }).max(500, { message: "reason_required" })),
});
export type CloseRecordInput = z.infer<typeof closeRecordSchema>;

export const exportRequestSchema = z.object({
  // An admin downloads a patient's data on the patient's request: the request is recorded.
  reason: z.preprocess((v) => (typeof v === "string" && v.trim() === "" ? undefined : v), z.string().trim().min(3).max(500).optional()),
  // json: every row Caddis holds; fhir: the clinical record as a FHIR R4 Bundle.
  format: z.enum(["json", "fhir"]).default("json"),
});
