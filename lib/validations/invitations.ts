import { z } from "zod";
import { multiLine, singleLine } from "./text";

// Kept equal to PASSWORD_MIN_LENGTH in lib/auth/password.ts (a unit test checks); that module
// uses node:crypto and cannot be bundled into the browser forms that share these schemas.
export const NEW_PASSWORD_MIN = 12;

const email = z.email().max(254).transform((v) => v.trim().toLowerCase());
const newPassword = z.string().min(NEW_PASSWORD_MIN).max(256);

export const patientInviteSchema = z.strictObject({
  email: z.union([email, z.literal("").transform(() => undefined)]).optional(),
});

export const activateSchema = z.strictObject({
  code: z.string().trim().min(8).max(40),
  email,
  password: newPassword,
});
export type ActivateInput = z.input<typeof activateSchema>;

export const carerInviteSchema = z.strictObject({ email });

export const acceptCarerInviteSchema = z.strictObject({
  token: z.string().min(20).max(200),
  // For a new carer account.
  name: singleLine(z.string().trim().min(1).max(120)).optional(),
  // For a new account (a new password) or an existing one (its password).
  password: z.string().min(1).max(256).optional(),
});
