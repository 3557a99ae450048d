"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useEffect } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { PasswordField } from "@/components/ui/password-field";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { activateSchema } from "@/lib/validations/invitations";

/** Open the portal account: the code from the care team, an e-mail address, a new password. */
export function ActivateForm() {
  const t = useTranslations("Activate");
  const locale = useLocale();
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof activateSchema>, unknown, z.output<typeof activateSchema>>({ resolver: zodResolver(activateSchema) });
  const failure = useSubmitFailure("Activate", setError);
  const text = failure.text;

  // An e-mailed link may carry the code after "#" (never sent to the server or in a Referer).
  useEffect(() => {
    const fromLink = window.location.hash.replace(/^#/, "");
    if (/^[0-9A-Za-z-]{8,40}$/.test(fromLink)) setValue("code", fromLink);
  }, [setValue]);

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      const body = await apiFetch<{ signedIn: boolean; next: string }>("/api/activate", { method: "POST", body: values });
      window.location.assign(body.signedIn ? body.next : `/${locale}/sign-in`);
    } catch (error) {
      failure.fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <ErrorAlert message={failure.message} />
      <Field
        label={t("code")}
        hint={t("codeHint")}
        autoComplete="one-time-code"
        autoCapitalize="characters"
        spellCheck={false}
        className="[&_input]:text-xl [&_input]:tracking-widest"
        errors={errors.code ? [text.one("code_invalid")] : undefined}
        {...register("code")}
      />
      <Field
        label={t("email")}
        hint={t("emailHint")}
        type="email"
        inputMode="email"
        autoComplete="username"
        errors={text.list(errors.email)}
        {...register("email")}
      />
      <PasswordField purpose="new" label={t("password")} errors={text.list(errors.password)} {...register("password")} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? t("working") : t("submit")}
      </Button>
    </form>
  );
}
