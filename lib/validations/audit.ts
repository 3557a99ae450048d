import { z } from "zod";
import { AUDIT_VIA } from "@/lib/shared/audit-actions";
import { queryInt } from "./number";
import { pageQuerySchema } from "./caseload";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { message: "date_invalid" });
const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

/** Audit search filters (query string of GET /api/admin/audit and its CSV export). */
export const auditQuerySchema = z
  .object({
    person: z.preprocess(blank, z.string().trim().max(120).optional()),
    patient: z.preprocess(blank, z.string().trim().max(120).optional()),
    action: z.preprocess(blank, z.string().trim().max(80).regex(/^[a-z0-9_.]+$/, { message: "action_invalid" }).optional()),
    via: z.preprocess(blank, z.enum(AUDIT_VIA).optional()),
    from: z.preprocess(blank, isoDate.optional()),
    to: z.preprocess(blank, isoDate.optional()),
    page: queryInt(1, 10_000, 1),
    pageSize: queryInt(1, 100, 50),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "range_invalid", path: ["to"] });
export type AuditQuery = z.infer<typeof auditQuerySchema>;

/** A patient's access log: a page, everyone or only people outside the care team, and a calendar month. */
export const accessLogQuerySchema = pageQuerySchema.extend({
  who: z.preprocess(blank, z.enum(["all", "outside"]).default("all")),
  month: z.preprocess(blank, z.string().regex(/^\d{4}-(0[1-9]|1[0-2])$/, { message: "month_invalid" }).optional()),
});
