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
import { Link } from "@/lib/i18n/navigation";
import { resetPasswordSchema, type ResetPasswordInput } from "@/lib/validations/staff";

export function ResetPasswordForm({ token }: { token: string }) {
  const t = useTranslations("PasswordReset");
  const [done, setDone] = useState(false);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<ResetPasswordInput>({ resolver: zodResolver(resetPasswordSchema), defaultValues: { newPassword: "", confirmPassword: "" } });
  const failure = useSubmitFailure("PasswordReset");
  const text = failure.text;
  if (done) {
    return (
      <DoneStatus message={t("done")}>
        <Link href="/sign-in" className="font-bold underline underline-offset-4">
          {t("goToSignIn")}
        </Link>
      </DoneStatus>
    );
  }
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={handleSubmit(async (v) => {
        failure.clear();
        const { error } = await authClient.resetPassword({ newPassword: v.newPassword, token });
        if (error) return failure.show(error.code?.startsWith("PASSWORD_") ? text.one(error.code.toLowerCase()) : t("errors.link_invalid"));
        setDone(true);
      })}
    >
      <ErrorAlert message={failure.message} />
      <PasswordField purpose="new" label={t("newPassword")} errors={text.list(errors.newPassword)} {...register("newPassword")} />
      <PasswordField purpose="confirm" label={t("confirmPassword")} errors={text.list(errors.confirmPassword)} {...register("confirmPassword")} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {t("save")}
      </Button>
    </form>
  );
}
