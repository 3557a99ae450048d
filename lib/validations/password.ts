// The one zod schema for a new password (lib/auth/password-rules), used by every form and route
// that sets one: staff invitation, reset and change, patient activation, carer invitation.
import { z } from "zod";
import { passwordProblem } from "@/lib/auth/password-rules";

export const newPasswordSchema = z.string({ error: "password_too_short" }).superRefine((p, ctx) => {
  const problem = passwordProblem(p);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});

/** A form that sets a password asks for it twice; the second box says when they differ. */
export function withConfirmation<T extends z.ZodRawShape>(shape: T, field: keyof T & string) {
  return z
    .object({ ...shape, confirmPassword: z.string() })
    .refine((v) => (v as Record<string, unknown>)[field] === (v as Record<string, unknown>).confirmPassword, { message: "password_mismatch", path: ["confirmPassword"] });
}
