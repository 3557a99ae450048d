import { z } from "zod";
import { DISCHARGE_TEACHING, DRAINAGE_KINDS } from "@/lib/clinical";
import { optionalNumber } from "./number";
import { multiLine } from "./text";

// Referrals, the care team's changes and the discharge checklist. Messages are codes the forms
// word through useErrorText("Transfer").

const blank = (v: unknown) => (v === "" || v === null || (typeof v === "string" && v.trim() === "") ? undefined : typeof v === "string" ? v.trim() : v);
const uuid = z.uuid({ error: "choose_one" });
const text = (min: number, max: number) => z.preprocess(blank, multiLine(z.string({ error: "required" }).min(min, { error: "too_short" }).max(max, { error: "too_long" })));
const optionalText = (max: number) => z.preprocess(blank, multiLine(z.string({ error: "text" }).max(max, { error: "too_long" })).optional());
const isoDate = z.preprocess(
  blank,
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: "date" })
    .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), { error: "date" })
    .optional(),
);

export const dischargeChecklistSchema = z
  .object({
    taught: z.array(z.enum(DISCHARGE_TEACHING, { error: "choose_one" })).max(DISCHARGE_TEACHING.length).refine((l) => new Set(l).size === l.length, { error: "choose_one" }),
    suppliesGiven: z.boolean({ error: "required" }),
    suppliesDays: optionalNumber({ min: 1, max: 366, unit: "days", whole: true }),
    drainage: z.preprocess(blank, z.enum(DRAINAGE_KINDS, { error: "choose_one" }).optional()),
    plannedTwocOn: isoDate,
    firstVisitOn: isoDate,
    portalActivationGiven: z.boolean({ error: "required" }),
    notes: optionalText(2000),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.suppliesGiven && v.suppliesDays === undefined) ctx.addIssue({ code: "custom", path: ["suppliesDays"], message: "required" });
  })
  .transform((v) => ({
    ...v,
    suppliesDays: v.suppliesDays ?? null,
    drainage: v.drainage ?? null,
    plannedTwocOn: v.plannedTwocOn ?? null,
    firstVisitOn: v.firstVisitOn ?? null,
    notes: v.notes ?? null,
  }));
export type DischargeChecklistValues = z.output<typeof dischargeChecklistSchema>;

export const referralSchema = z
  .object({
    toOrganisationId: uuid,
    /** The referring team: one of the viewer's own on the care team (needed when they have several). */
    fromOrganisationId: z.preprocess(blank, uuid.optional()),
    handoverNote: text(10, 4000),
    referrerStays: z.boolean({ error: "required" }),
    checklist: dischargeChecklistSchema.optional(),
  })
  .strict();

export const declineSchema = z.object({ reason: text(5, 1000) }).strict();

export const directoryQuerySchema = z.object({ q: z.preprocess(blank, z.string().max(80, { error: "too_long" }).optional()) }).strict();

export const careTeamAddSchema = z.object({ organisationId: uuid, reason: text(5, 1000) }).strict();
export const careTeamLeadSchema = z.object({ leadOrganisationId: uuid, reason: text(5, 1000) }).strict();
export const careTeamLeaveSchema = z.object({ reason: text(5, 1000) }).strict();
