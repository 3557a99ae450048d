import { z } from "zod";
import { multiLine } from "./text";

// `token` is what the clinician holds: the QR token or the typed short code. Error messages are
// keys (VisitAccess.errors.<key>).
export const VISIT_REASON_MIN = 10;

export const visitAccessSchema = z.object({
  token: z.string({ error: "required" }).trim().min(1, { error: "required" }).max(100, { error: "too_long" }),
  reason: multiLine(z.string({ error: "required" }).trim().min(VISIT_REASON_MIN, { error: "too_short" }).max(500, { error: "too_long" })),
});
export type VisitAccessInput = z.infer<typeof visitAccessSchema>;
