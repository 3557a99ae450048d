// Recording a catheter: insertion, change, removal and trial without catheter (TWOC). One set
// of schemas for the react-hook-form forms and the route handlers. Error messages are keys
// (EpisodeForm.errors.<key>) so the form can show them in the nurse's language.
import { z } from "zod";
import { multiLine, singleLine } from "./text";
import type { RangeUnit } from "@/lib/shared/numbers";
import { optionalNumber, requiredNumber } from "./number";
import {
  CATHETER_TYPES,
  FINDING_CODES,
  GEL_KINDS,
  LENGTH_CATEGORIES,
  MATERIALS,
  REMOVAL_REASONS,
  ROUTES,
  TWOC_FAILED_ACTIONS,
  TWOC_OUTCOMES,
  TWOC_SYMPTOMS,
  UNPLANNED_REASONS,
} from "@/lib/clinical";

export const RECORD_KINDS = ["insertion", "change", "removal", "twoc"] as const;
export type RecordKind = (typeof RECORD_KINDS)[number];

/** Clock difference allowed between a nurse's device and the server. */
export const FUTURE_TOLERANCE_MS = 5 * 60_000;
export const OVERRIDE_MIN_CHARS = 10;

/** Empty form values ("" from a text box, NaN from an empty number box, null) mean "not given". */
const blankToUndefined = (v: unknown) =>
  v === "" || v === null || (typeof v === "number" && Number.isNaN(v)) || (typeof v === "string" && v.trim() === "")
    ? undefined
    : typeof v === "string"
      ? v.trim()
      : v;

const requiredInt = (min: number, max: number, unit?: RangeUnit) => requiredNumber({ min, max, unit, whole: true });
const optionalInt = (min: number, max: number, unit?: RangeUnit) => optionalNumber({ min, max, unit, whole: true });
const optionalDecimal = (min: number, max: number, unit?: RangeUnit) => optionalNumber({ min, max, unit });
const optionalText = (max: number) => z.preprocess(blankToUndefined, multiLine(z.string({ error: "text" }).max(max, { error: "too_long" })).optional());
/** A name, a lot or a serial as on the label: one line, no bidirectional overrides. */
const optionalLine = (max: number) => z.preprocess(blankToUndefined, singleLine(z.string({ error: "text" }).max(max, { error: "too_long" })).optional());
const requiredText = (min: number, max: number) =>
  z.preprocess(
    blankToUndefined,
    multiLine(z.string({ error: "required" }).min(min, { error: "too_short" }).max(max, { error: "too_long" })),
  );
const choice = <T extends readonly [string, ...string[]]>(values: T) =>
  z.preprocess(blankToUndefined, z.enum(values, { error: "choose_one" }));
const optionalChoice = <T extends readonly [string, ...string[]]>(values: T) =>
  z.preprocess(blankToUndefined, z.enum(values, { error: "choose_one" }).optional());

const isoDate = z.preprocess(
  blankToUndefined,
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, { error: "date" })
    .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), {
      error: "date",
    })
    .optional(),
);

/** An instant with its offset (the form converts the nurse's local time), not in the future. */
export const pastInstant = z.preprocess(
  blankToUndefined,
  z
    .string({ error: "required" })
    .refine((s) => z.iso.datetime({ offset: true }).safeParse(s).success, { error: "date_time" })
    .refine((s) => Date.parse(s) <= Date.now() + FUTURE_TOLERANCE_MS, { error: "in_future" })
    .refine((s) => Date.parse(s) >= Date.parse("2000-01-01T00:00:00Z"), { error: "too_early" }),
);

export const overrideSchema = z.object({
  code: z.enum(FINDING_CODES, { error: "choose_one" }),
  reason: requiredText(OVERRIDE_MIN_CHARS, 500),
});

/** The device itself: what checkDevice reads. Also the body of POST …/episodes/check. */
export const deviceShape = {
  route: choice(ROUTES),
  catheterType: choice(CATHETER_TYPES),
  material: choice(MATERIALS),
  lengthCategory: choice(LENGTH_CATEGORIES),
  sizeCh: requiredInt(6, 30, "ch"),
  balloonMl: requiredInt(1, 30, "ml"),
  makerBalloonMl: optionalInt(1, 30, "ml"),
  maker: optionalLine(120),
  productName: optionalLine(120),
  lot: optionalLine(40),
  expiry: isoDate,
  gtin: z.preprocess(blankToUndefined, z.string().regex(/^\d{8,14}$/, { error: "gtin" }).optional()),
  serial: optionalLine(40),
  udi: optionalText(200),
  gelKind: choice(GEL_KINDS),
  gelVolumeMl: optionalDecimal(0, 30, "ml"),
  largerSizeReason: optionalText(500),
  maxDwellDays: optionalInt(1, 366, "days"),
};

export const deviceCheckSchema = z.object({
  ...deviceShape,
  /** The day the check is for (the insertion's calendar day); default today. */
  insertedAt: pastInstant.optional(),
});
export type DeviceCheckInput = z.infer<typeof deviceCheckSchema>;

/** Every documentation field of an insertion (EAUN 2012 chapter 12, plus lot, maker, expiry). */
export const insertionObject = z.object({
  ...deviceShape,
  indication: requiredText(3, 500),
  insertedAt: pastInstant,
  residualUrineMl: optionalInt(0, 5000, "ml"),
  urineDescription: optionalText(300),
  specimenTaken: z.boolean({ error: "choose_one" }).default(false),
  attempts: requiredInt(1, 10),
  difficulties: optionalText(1000),
  patientReaction: optionalText(500),
  reviewIntervalDays: optionalInt(1, 366, "days"),
  overrides: z.array(overrideSchema).max(FINDING_CODES.length).default([]),
});

type InsertionShape = z.infer<typeof insertionObject>;

/**
 * Cross-field rules run even when other fields already failed, so the nurse sees every
 * problem at once; they read the values defensively for that reason.
 */
const always = { when: (p: { value: unknown }) => typeof p.value === "object" && p.value !== null };

/** Rules across fields, shared by the insertion and change schemas. */
function insertionRules(v: InsertionShape, ctx: z.RefinementCtx) {
  if ((GEL_KINDS as readonly unknown[]).includes(v.gelKind) && v.gelKind !== "none" && typeof v.gelVolumeMl !== "number") {
    ctx.addIssue({ code: "custom", path: ["gelVolumeMl"], message: "gel_volume_required" });
  }
  if (!Array.isArray(v.overrides)) return;
  const seen = new Set<unknown>();
  v.overrides.forEach((o, i) => {
    if (o && seen.has(o.code)) ctx.addIssue({ code: "custom", path: ["overrides", i, "code"], message: "duplicate" });
    seen.add(o?.code);
  });
}

export const insertionSchema = insertionObject.superRefine(insertionRules, always);
export type InsertionInput = z.infer<typeof insertionSchema>;

export const changeSchema = insertionObject
  .extend({
    changeKind: choice(["planned", "unplanned"] as const),
    unplannedReason: optionalChoice(UNPLANNED_REASONS),
    reasonNotes: optionalText(1000),
    /** The need for a catheter was reviewed at this change (SIGN 160). */
    needReviewed: z.boolean({ error: "choose_one" }).default(false),
  })
  .superRefine((v, ctx) => {
    insertionRules(v, ctx);
    if (v.changeKind === "unplanned" && !v.unplannedReason) {
      ctx.addIssue({ code: "custom", path: ["unplannedReason"], message: "unplanned_reason_required" });
    }
    if (v.changeKind === "planned" && v.unplannedReason) {
      ctx.addIssue({ code: "custom", path: ["unplannedReason"], message: "planned_no_reason" });
    }
    if (v.unplannedReason === "other" && !v.reasonNotes) {
      ctx.addIssue({ code: "custom", path: ["reasonNotes"], message: "notes_required" });
    }
  }, always);
export type ChangeInput = z.infer<typeof changeSchema>;

export const removalSchema = z
  .object({
    removedAt: pastInstant,
    reason: choice(REMOVAL_REASONS),
    notes: optionalText(1000),
    /** The catheter comes out for a trial without catheter: the outcome is recorded next. */
    startTwoc: z.boolean({ error: "choose_one" }).default(false),
    balloonDeflatedMl: optionalInt(0, 60, "ml"),
    catheterIntact: z.boolean({ error: "choose_one" }).default(true),
  })
  .superRefine((v, ctx) => {
    if (v.reason === "other" && !v.notes) ctx.addIssue({ code: "custom", path: ["notes"], message: "notes_required" });
    if (v.catheterIntact === false && !v.notes) ctx.addIssue({ code: "custom", path: ["notes"], message: "notes_required" });
  }, always);
export type RemovalInput = z.infer<typeof removalSchema>;

export const voidSchema = z.object({
  /** The time of day the patient passed urine ("14:05"), when the nurse has it. */
  at: z.preprocess(blankToUndefined, z.string({ error: "text" }).regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: "clock_time" }).optional()),
  volumeMl: requiredInt(1, 2000, "ml"),
});

export const twocSchema = z
  .object({
    occurredAt: pastInstant,
    outcome: choice(TWOC_OUTCOMES),
    voids: z.array(voidSchema).max(20, { error: "too_many" }).default([]),
    postVoidResidualMl: optionalInt(0, 5000, "ml"),
    /** What the patient felt; a checkbox group sends false when nothing is ticked. */
    symptoms: z.preprocess(
      (v) => (v === false || v === null || v === undefined ? [] : typeof v === "string" ? [v] : v),
      z
        .array(z.enum(TWOC_SYMPTOMS, { error: "choose_one" }))
        .max(TWOC_SYMPTOMS.length)
        .refine((l) => new Set(l).size === l.length, { error: "choose_one" }),
    ),
    /** Why the trial failed or was abandoned (required for those). */
    reason: optionalText(1000),
    failedAction: optionalChoice(TWOC_FAILED_ACTIONS),
    notes: optionalText(1000),
    /** After a passed trial: the patient leaves the catheter caseload until the follow-up review. */
    discharge: z.boolean({ error: "choose_one" }).default(false),
    followUpReviewOn: isoDate,
  })
  .superRefine((v, ctx) => {
    if (v.discharge && v.outcome !== "passed") ctx.addIssue({ code: "custom", path: ["discharge"], message: "discharge_passed_only" });
    if (v.discharge && !v.followUpReviewOn) ctx.addIssue({ code: "custom", path: ["followUpReviewOn"], message: "required" });
    if (!v.discharge && v.followUpReviewOn) ctx.addIssue({ code: "custom", path: ["followUpReviewOn"], message: "discharge_passed_only" });
    if (v.outcome === "failed" && !v.failedAction) {
      ctx.addIssue({ code: "custom", path: ["failedAction"], message: "failed_action_required" });
    }
    if (v.outcome === "passed" && v.failedAction) {
      ctx.addIssue({ code: "custom", path: ["failedAction"], message: "passed_no_action" });
    }
    if (v.outcome === "abandoned" && !v.reason) ctx.addIssue({ code: "custom", path: ["reason"], message: "required" });
    if (v.failedAction === "other" && !v.notes) ctx.addIssue({ code: "custom", path: ["notes"], message: "notes_required" });
  }, always);
export type TwocInput = z.infer<typeof twocSchema>;

/**
 * The trial without catheter planned for the catheter in place: its day (today to a year ahead,
 * checked on the server in the deployment's zone) and any medicine given before it, as the nurse
 * writes it. `clear` (and no day) removes the plan.
 */
export const twocPlanSchema = z
  .object({
    plannedOn: isoDate,
    medicineNote: optionalText(300),
    clear: z.boolean({ error: "choose_one" }).default(false),
  })
  .superRefine((v, ctx) => {
    if (!v.clear && !v.plannedOn) ctx.addIssue({ code: "custom", path: ["plannedOn"], message: "required" });
    if (v.clear && v.plannedOn) ctx.addIssue({ code: "custom", path: ["clear"], message: "choose_one" });
  }, always);
export type TwocPlanInput = z.infer<typeof twocPlanSchema>;


/**
 * The follow-up review of a patient discharged from the catheter caseload after a passed trial:
 * when it took place, what was found, and the day of another review if one is needed (none: the
 * follow-up ends and the patient leaves the caseload's "Follow-up review" list).
 */
export const followUpReviewSchema = z
  .object({
    reviewedAt: pastInstant,
    notes: requiredText(3, 1000),
    /** Another review to come (today to a year ahead, checked on the server), or none. */
    nextReviewOn: isoDate,
  });
export type FollowUpReviewInput = z.infer<typeof followUpReviewSchema>;
