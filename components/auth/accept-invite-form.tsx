"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { useErrorText } from "@/components/admin/use-field-errors";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { ApiError, apiFetch } from "@/lib/browser/api-client";
import { authClient } from "@/lib/auth/client";
import { acceptInviteFormSchema, PASSWORD_MIN_LENGTH, type AcceptInviteFormInput } from "@/lib/validations/staff";

/** The invitee chooses their name and password, then is signed in. */
export function AcceptInviteForm({ token, email, suggestedName }: { token: string; email: string; suggestedName: string }) {
  const t = useTranslations("AcceptInvite");
  const errorText = useErrorText("AcceptInvite");
  const locale = useLocale();
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<AcceptInviteFormInput>({ resolver: zodResolver(acceptInviteFormSchema), defaultValues: { name: suggestedName, password: "", confirmPassword: "" } });

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={handleSubmit(async (v) => {
        setFailure(null);
        try {
          await apiFetch(`/api/staff-invitations/accept?locale=${locale}`, { method: "POST", body: { token, name: v.name, password: v.password } });
        } catch (error) {
          if (error instanceof ApiError) for (const [f, codes] of Object.entries(error.fields)) setError(f as keyof AcceptInviteFormInput, { message: codes[0] });
          setFailure(error instanceof ApiError && error.status === 404 ? t("errors.link_invalid") : errorText.ofError(error));
          return;
        }
        const { error } = await authClient.signIn.email({ email, password: v.password });
        if (error) {
          window.location.assign(`/${locale}/sign-in`);
          return;
        }
        window.location.assign(`/${locale}/home`);
      })}
    >
      {failure ? <Notice tone="stop" role="alert" title={failure} /> : null}
      <Field label={t("email")} value={email} readOnly autoComplete="username" />
      {/* defaultValue: the suggested name is in the server's HTML, not only after hydration. */}
      <Field label={t("name")} autoComplete="name" defaultValue={suggestedName} errors={errorText.list(errors.name)} {...register("name")} />
      <Field
        label={t("password")}
        hint={t("passwordRules", { min: PASSWORD_MIN_LENGTH })}
        type="password"
        autoComplete="new-password"
        errors={errorText.list(errors.password)}
        {...register("password")}
      />
      <Field label={t("confirmPassword")} type="password" autoComplete="new-password" errors={errorText.list(errors.confirmPassword)} {...register("confirmPassword")} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? t("working") : t("submit")}
      </Button>
    </form>
  );
}
