"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { activateSchema, NEW_PASSWORD_MIN } from "@/lib/validations/invitations";

/** Open the portal account: the code from the care team, an e-mail address, a new password. */
export function ActivateForm() {
  const t = useTranslations("Activate");
  const locale = useLocale();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof activateSchema>, unknown, z.output<typeof activateSchema>>({ resolver: zodResolver(activateSchema) });

  // An e-mailed link may carry the code after "#" (never sent to the server or in a Referer).
  useEffect(() => {
    const fromLink = window.location.hash.replace(/^#/, "");
    if (/^[0-9A-Za-z-]{8,40}$/.test(fromLink)) setValue("code", fromLink);
  }, [setValue]);

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    const res = await fetch("/api/activate", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(values) });
    const body = await res.json().catch(() => null);
    if (res.ok) {
      window.location.assign(body?.signedIn ? body.next : `/${locale}/sign-in`);
      return;
    }
    if (res.status === 429) return setFormError(t("tooMany"));
    const fields = body?.error?.fields ?? {};
    if (fields.code) setError("code", { message: "invalid" });
    if (fields.email) setError("email", { message: fields.email[0] });
    if (fields.password) setError("password", { message: fields.password[0] });
    if (!fields.code && !fields.email && !fields.password) setFormError(t("error"));
  });

  const passwordError = errors.password
    ? errors.password.message === "too_common"
      ? t("passwordCommon")
      : t("passwordShort", { min: NEW_PASSWORD_MIN })
    : undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {formError ? (
        <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
          {formError}
        </p>
      ) : null}
      <Field
        label={t("code")}
        hint={t("codeHint")}
        autoComplete="one-time-code"
        autoCapitalize="characters"
        spellCheck={false}
        className="[&_input]:text-xl [&_input]:tracking-widest"
        errors={errors.code ? [t("codeInvalid")] : undefined}
        {...register("code")}
      />
      <Field
        label={t("email")}
        hint={t("emailHint")}
        type="email"
        inputMode="email"
        autoComplete="username"
        errors={errors.email ? [errors.email.message === "taken" ? t("emailTaken") : t("emailInvalid")] : undefined}
        {...register("email")}
      />
      <Field
        label={t("password")}
        hint={t("passwordHint", { min: NEW_PASSWORD_MIN })}
        type="password"
        autoComplete="new-password"
        errors={passwordError ? [passwordError] : undefined}
        {...register("password")}
      />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? t("working") : t("submit")}
      </Button>
    </form>
  );
}
