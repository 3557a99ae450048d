import { z } from "zod";
import { newPasswordSchema } from "./password";
import { singleLine } from "./text";

const email = z.email({ message: "email_invalid" }).max(254, { message: "email_invalid" }).transform((v) => v.trim().toLowerCase());

export const patientInviteSchema = z.strictObject({
  email: z.union([email, z.literal("").transform(() => undefined)]).optional(),
});

export const activateSchema = z.strictObject({
  code: z.string().trim().min(8, { message: "code_invalid" }).max(40, { message: "code_invalid" }),
  email,
  password: newPasswordSchema,
});

export const carerInviteSchema = z.strictObject({ email });

export const acceptCarerInviteSchema = z.strictObject({
  token: z.string().min(20).max(200),
  // For a new carer account.
  name: singleLine(z.string().trim().min(1).max(120)).optional(),
  // For a new account (a new password, checked against the rules by the service) or an existing one (its password).
  password: z.string().min(1).max(256).optional(),
});

/** What the carer's invitation page asks for: nothing when signed in as the carer, the password of their account, or a new account. */
export const carerInviteFormSchemas = {
  accept: z.object({}),
  "sign-in": z.object({ password: z.string().min(1, { message: "password_required" }).max(256) }),
  create: z.object({ name: singleLine(z.string().trim().min(1, { message: "name_required" }).max(120, { message: "invalid" })), password: newPasswordSchema }),
} as const;

/** A carer's choice to be told when the patient reports an urgent or emergency problem. */
export const carerAlertSchema = z.strictObject({
  patientId: z.uuid(),
  on: z.boolean(),
  // How she is told: e-mail (the default), a push to her phones, or a text (her number on More → Reminders).
  channel: z.enum(["email", "push", "sms"]).optional(),
});
