// Acknowledging an alert on the caseload (what was done, a note that "other" needs), or marking
// a sample's result chased. Messages are error codes (Errors.<code>).
import { z } from "zod";
import { ACKNOWLEDGE_ACTIONS } from "@/lib/clinical";
import { multiLine } from "./text";

const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v === null ? undefined : v);

export const acknowledgeSchema = z
  .object({
    // Required for an alert (checked against the item); a sample's result needs none.
    action: z.preprocess(blank, z.enum(ACKNOWLEDGE_ACTIONS, { error: "choose_one" }).optional()),
    note: z.preprocess(blank, multiLine(z.string().trim().max(1000, { error: "too_long" })).optional()),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.action === "other" && !v.note) ctx.addIssue({ code: "custom", path: ["note"], message: "required" });
  });
export type AcknowledgeInput = z.infer<typeof acknowledgeSchema>;
