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
import { carerInviteFormSchemas } from "@/lib/validations/invitations";

type Mode = keyof typeof carerInviteFormSchemas;
type Values = { name?: string; password?: string };

/** Accept a carer invitation: as the signed-in carer, with the carer account's password, or with a new account. */
export function CarerInviteForm({ token, mode, email }: { token: string; mode: Mode; email?: string }) {
  const t = useTranslations("CarerInvite");
  const locale = useLocale();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({ resolver: zodResolver(carerInviteFormSchemas[mode]) as never, defaultValues: { name: "", password: "" } });
  const failure = useSubmitFailure("CarerInvite", setError);

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      await apiFetch("/api/carer-invites/accept", { method: "POST", body: { token, ...values } });
      window.location.assign(`/${locale}/today`);
    } catch (error) {
      failure.fail(error, (e) => (e.fields.token ? t("invalid") : null));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <ErrorAlert message={failure.message} />
      {email ? (
        <p>
          {t("yourEmail")} <strong className="[overflow-wrap:anywhere]">{email}</strong>
        </p>
      ) : null}
      {/* Lets password managers store the address with the new password (WCAG 3.3.8). */}
      {email && mode !== "accept" ? <input type="email" name="username" autoComplete="username" value={email} readOnly hidden /> : null}
      {mode === "create" ? <Field label={t("name")} autoComplete="name" errors={failure.text.list(errors.name)} {...register("name")} /> : null}
      {mode !== "accept" ? (
        <PasswordField
          purpose={mode === "create" ? "new" : "current"}
          label={mode === "create" ? t("newPassword") : t("password")}
          errors={failure.text.list(errors.password)}
          {...register("password")}
        />
      ) : null}
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg" data-testid="accept-invite">
        {mode === "create" ? t("create") : mode === "sign-in" ? t("signInAccept") : t("accept")}
      </Button>
    </form>
  );
}
