"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { PasswordField } from "@/components/ui/password-field";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { authClient } from "@/lib/auth/client";
import { acceptInviteFormSchema, type AcceptInviteFormInput } from "@/lib/validations/staff";

/** The invitee chooses their name and password, then is signed in. */
export function AcceptInviteForm({ token, email, suggestedName }: { token: string; email: string; suggestedName: string }) {
  const t = useTranslations("AcceptInvite");
  const locale = useLocale();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<AcceptInviteFormInput>({ resolver: zodResolver(acceptInviteFormSchema), defaultValues: { name: suggestedName, password: "", confirmPassword: "" } });
  const failure = useSubmitFailure("AcceptInvite", setError);
  const text = failure.text;

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={handleSubmit(async (v) => {
        failure.clear();
        try {
          await apiFetch(`/api/staff-invitations/accept?locale=${locale}`, { method: "POST", body: { token, name: v.name, password: v.password } });
        } catch (error) {
          failure.fail(error, (e) => (e.status === 404 ? t("errors.link_invalid") : null));
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
      <ErrorAlert message={failure.message} />
      <Field label={t("email")} value={email} readOnly autoComplete="username" />
      {/* defaultValue: the suggested name is in the server's HTML, not only after hydration. */}
      <Field label={t("name")} autoComplete="name" defaultValue={suggestedName} errors={text.list(errors.name)} {...register("name")} />
      <PasswordField purpose="new" label={t("password")} errors={text.list(errors.password)} {...register("password")} />
      <PasswordField purpose="confirm" label={t("confirmPassword")} errors={text.list(errors.confirmPassword)} {...register("confirmPassword")} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? t("working") : t("submit")}
      </Button>
    </form>
  );
}
