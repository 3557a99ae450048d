"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { authClient } from "@/lib/auth/client";
import { changePasswordSchema, PASSWORD_MIN_LENGTH, type ChangePasswordInput } from "@/lib/validations/staff";
import { useErrorText } from "@/components/admin/use-field-errors";

/** A new password needs the current one (re-authentication); every other session is signed out. */
export function ChangePasswordForm() {
  const t = useTranslations("Account");
  const errorText = useErrorText("Account");
  const [status, setStatus] = useState<{ tone: "ok" | "stop"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<ChangePasswordInput>({ resolver: zodResolver(changePasswordSchema), defaultValues: { currentPassword: "", newPassword: "", confirmPassword: "" } });

  return (
    <form
      noValidate
      className="flex max-w-md flex-col gap-4"
      onSubmit={handleSubmit(async (v) => {
        setStatus(null);
        const { error } = await authClient.changePassword({ currentPassword: v.currentPassword, newPassword: v.newPassword, revokeOtherSessions: true });
        if (error) {
          const code = error.code === "PASSWORD_TOO_COMMON" ? "password_too_common" : error.status === 429 ? "rate_limited" : "current_wrong";
          setStatus({ tone: "stop", text: errorText.one(code) });
          return;
        }
        reset();
        setStatus({ tone: "ok", text: t("passwordChanged") });
      })}
    >
      {status ? <Notice tone={status.tone} role={status.tone === "stop" ? "alert" : "status"} title={status.text} /> : null}
      <Field label={t("currentPassword")} type="password" autoComplete="current-password" errors={errorText.list(errors.currentPassword)} {...register("currentPassword")} />
      <Field
        label={t("newPassword")}
        hint={t("passwordRules", { min: PASSWORD_MIN_LENGTH })}
        type="password"
        autoComplete="new-password"
        errors={errorText.list(errors.newPassword)}
        {...register("newPassword")}
      />
      <Field label={t("confirmPassword")} type="password" autoComplete="new-password" errors={errorText.list(errors.confirmPassword)} {...register("confirmPassword")} />
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {t("changePassword")}
        </Button>
      </div>
    </form>
  );
}
