"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { useErrorText } from "@/components/admin/use-field-errors";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { authClient } from "@/lib/auth/client";
import { Link } from "@/lib/i18n/navigation";
import { PASSWORD_MIN_LENGTH, resetPasswordSchema, type ResetPasswordInput } from "@/lib/validations/staff";

export function ResetPasswordForm({ token }: { token: string }) {
  const t = useTranslations("PasswordReset");
  const errorText = useErrorText("PasswordReset");
  const [done, setDone] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<ResetPasswordInput>({ resolver: zodResolver(resetPasswordSchema), defaultValues: { newPassword: "", confirmPassword: "" } });
  if (done) {
    return (
      <Notice tone="ok" role="status" title={t("done")}>
        <Link href="/sign-in" className="font-bold underline underline-offset-4">
          {t("goToSignIn")}
        </Link>
      </Notice>
    );
  }
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={handleSubmit(async (v) => {
        setFailure(null);
        const { error } = await authClient.resetPassword({ newPassword: v.newPassword, token });
        if (error) return setFailure(error.code === "PASSWORD_TOO_COMMON" ? errorText.one("password_too_common") : t("errors.link_invalid"));
        setDone(true);
      })}
    >
      {failure ? <Notice tone="stop" role="alert" title={failure} /> : null}
      <Field
        label={t("newPassword")}
        hint={t("passwordRules", { min: PASSWORD_MIN_LENGTH })}
        type="password"
        autoComplete="new-password"
        errors={errorText.list(errors.newPassword)}
        {...register("newPassword")}
      />
      <Field label={t("confirmPassword")} type="password" autoComplete="new-password" errors={errorText.list(errors.confirmPassword)} {...register("confirmPassword")} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {t("save")}
      </Button>
    </form>
  );
}
