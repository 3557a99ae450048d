"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { PasswordField } from "@/components/ui/password-field";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { authClient } from "@/lib/auth/client";
import { changePasswordSchema, type ChangePasswordInput } from "@/lib/validations/staff";

/** A new password needs the current one (re-authentication); every other session is signed out. */
export function ChangePasswordForm() {
  const t = useTranslations("Account");
  const [changed, setChanged] = useState(false);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<ChangePasswordInput>({ resolver: zodResolver(changePasswordSchema), defaultValues: { currentPassword: "", newPassword: "", confirmPassword: "" } });
  const failure = useSubmitFailure("Account");
  const text = failure.text;

  return (
    <form
      noValidate
      className="flex max-w-md flex-col gap-4"
      onSubmit={handleSubmit(async (v) => {
        failure.clear();
        setChanged(false);
        const { error } = await authClient.changePassword({ currentPassword: v.currentPassword, newPassword: v.newPassword, revokeOtherSessions: true });
        if (error) {
          const code = error.code?.startsWith("PASSWORD_") ? error.code.toLowerCase() : error.status === 429 ? "rate_limited" : "current_wrong";
          return failure.show(text.one(code));
        }
        reset();
        setChanged(true);
      })}
    >
      <ErrorAlert message={failure.message} />
      <DoneStatus message={changed ? t("passwordChanged") : null} />
      <PasswordField purpose="current" label={t("currentPassword")} errors={text.list(errors.currentPassword)} {...register("currentPassword")} />
      <PasswordField purpose="new" label={t("newPassword")} errors={text.list(errors.newPassword)} {...register("newPassword")} />
      <PasswordField purpose="confirm" label={t("confirmPassword")} errors={text.list(errors.confirmPassword)} {...register("confirmPassword")} />
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {t("changePassword")}
        </Button>
      </div>
    </form>
  );
}
