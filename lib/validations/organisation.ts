import { z } from "zod";
import { multiLine, singleLine } from "./text";
import type { OrganisationKind } from "@/db/schema/app";
import { locales } from "@/lib/i18n/routing";

// The schema's kinds, repeated so client forms need not load the database schema.
export const organisationKinds = ["hospital_ward", "community_team", "gp_practice"] as const satisfies readonly OrganisationKind[];

// Messages are codes the organisation form translates (AdminOrganisations.errors.<code>).
const blankToNull = (v: unknown) => (typeof v === "string" && v.trim() === "" ? null : v);

export const phoneSchema = z.preprocess(
  blankToNull,
  z
    .string()
    .trim()
    .max(32, { message: "phone_invalid" })
    .regex(/^\+?[0-9][0-9 ()-]*[0-9]$/, { message: "phone_invalid" })
    .refine((v) => v.replace(/[^0-9]/g, "").length >= 3, { message: "phone_invalid" })
    .nullable(),
);

const organisationFields = z.object({
  name: singleLine(z.string().trim().min(2, { message: "name_length" }).max(120, { message: "name_length" })),
  kind: z.enum(organisationKinds, { message: "kind_required" }),
  parentName: z.preprocess(blankToNull, singleLine(z.string().trim().max(120, { message: "name_length" })).nullable()).optional(),
  phone: phoneSchema.optional(),
  outOfHoursPhone: phoneSchema.optional(),
  inboxEmail: z.preprocess(blankToNull, z.email({ message: "email_invalid" }).max(254).nullable()).optional(),
  locale: z.enum(locales, { message: "locale_required" }),
  languages: z
    .array(z.enum(locales, { message: "locale_required" }))
    .min(1, { message: "languages_required" })
    .refine((l) => new Set(l).size === l.length, { message: "languages_repeated" }),
  requireTwoFactor: z.boolean(),
  // Why this organisation's staff may sign in with a password alone: required to relax two-step
  // sign-in, kept on record with who relaxed it and when.
  twoFactorRelaxedReason: z
    .preprocess(blankToNull, multiLine(z.string().trim().min(10, { message: "reason_length" }).max(500, { message: "reason_length" })).nullable())
    .optional(),
});

/** Turning two-step sign-in off needs a reason. */
function relaxingNeedsReason(v: { requireTwoFactor?: boolean; twoFactorRelaxedReason?: string | null }, ctx: z.RefinementCtx) {
  if (v.requireTwoFactor === false && !v.twoFactorRelaxedReason) {
    ctx.addIssue({ code: "custom", path: ["twoFactorRelaxedReason"], message: "reason_required" });
  }
}

export const organisationSchema = organisationFields.superRefine(relaxingNeedsReason);
export type OrganisationInput = z.infer<typeof organisationSchema>;
export type OrganisationFormValues = z.input<typeof organisationSchema>;

export const organisationPatchSchema = organisationFields.partial().strict().superRefine(relaxingNeedsReason);
