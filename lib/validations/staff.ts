import { z } from "zod";
import { multiLine, singleLine } from "./text";
import type { StaffRole } from "@/db/schema/app";
import { newPasswordSchema, withConfirmation } from "./password";

export const staffRoles = ["admin", "clinician"] as const satisfies readonly StaffRole[];

// Messages are codes the staff forms translate (AdminStaff.errors.<code>, AcceptInvite.errors.<code>).
const organisationIds = z
  .array(z.uuid({ message: "organisations_required" }))
  .min(1, { message: "organisations_required" })
  .max(50)
  .refine((ids) => new Set(ids).size === ids.length, { message: "organisations_required" });

export const inviteStaffSchema = z.object({
  email: z.email({ message: "email_invalid" }).max(254).transform((e) => e.toLowerCase()),
  name: z.preprocess(
    (v) => (typeof v === "string" && v.trim() === "" ? null : v),
    singleLine(z.string().trim().max(120, { message: "name_length" })).nullable().optional(),
  ),
  role: z.enum(staffRoles, { message: "role_required" }),
  // The e-mail goes out in the language of the first organisation chosen.
  organisationIds,
});
export type InviteStaffInput = z.infer<typeof inviteStaffSchema>;
export type InviteStaffFormValues = z.input<typeof inviteStaffSchema>;

export const updateStaffSchema = z
  .object({
    role: z.enum(staffRoles, { message: "role_required" }),
    /** The member's organisations among those the admin manages (others are left alone). */
    organisationIds: z.array(z.uuid()).max(50),
  })
  .partial()
  .strict();
export type UpdateStaffInput = z.infer<typeof updateStaffSchema>;

export const acceptInviteSchema = z.object({
  token: z.string().min(20).max(200),
  name: singleLine(z.string().trim().min(2, { message: "name_length" }).max(120, { message: "name_length" })),
  password: newPasswordSchema,
});
export type AcceptInviteInput = z.infer<typeof acceptInviteSchema>;

export const changePasswordSchema = withConfirmation(
  { currentPassword: z.string().min(1, { message: "current_required" }).max(256), newPassword: newPasswordSchema },
  "newPassword",
);
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export const resetPasswordSchema = withConfirmation({ newPassword: newPasswordSchema }, "newPassword");
export type ResetPasswordInput = z.infer<typeof resetPasswordSchema>;

export const acceptInviteFormSchema = withConfirmation({ name: acceptInviteSchema.shape.name, password: newPasswordSchema }, "password");
export type AcceptInviteFormInput = z.infer<typeof acceptInviteFormSchema>;

export const totpCodeSchema = z.object({ code: z.string().trim().regex(/^\d{6}$/, { message: "code_format" }) });
export const backupCodeSchema = z.object({ code: z.string().trim().min(6, { message: "backup_format" }).max(32, { message: "backup_format" }) });
