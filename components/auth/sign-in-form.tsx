"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { PasswordField } from "@/components/ui/password-field";
import { TwoFactorCodeForm } from "@/components/account/two-factor-code-form";
import { authClient } from "@/lib/auth/client";
import { sameSitePath } from "@/lib/shared/same-site-path";
import { signInSchema, type SignInInput } from "@/lib/validations/auth";

/** `returnTo`: a same-site path to go back to after signing in (the passport's visit-access page). */
export function SignInForm({ returnTo }: { returnTo?: string } = {}) {
  const t = useTranslations("SignIn");
  const tErrors = useTranslations("Errors");
  const locale = useLocale();
  const [formError, setFormError] = useState<string | null>(null);
  const [secondStep, setSecondStep] = useState(false);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    const { data, error } = await authClient.signIn.email({ email: values.email, password: values.password });
    if (error) {
      // Held back by the per-account delay: say how long (lib/auth/sign-in-throttle.ts).
      const wait = Number((error as { retryAfterSeconds?: unknown }).retryAfterSeconds);
      if (error.status === 429 && error.code === "ACCOUNT_DELAYED" && wait > 0) {
        setFormError(t("delayed", { wait: wait < 90 ? t("waitSeconds", { count: wait }) : t("waitMinutes", { count: Math.ceil(wait / 60) }) }));
        return;
      }
      setFormError(error.status === 429 ? tErrors("rate_limited") : error.status === 403 ? t("inactive") : t("wrong"));
      return;
    }
    // Two-step sign-in: the password was right; the code finishes signing in — on the code page,
    // or here when this page wants its visitor back (its address may hold a card token, which
    // must not travel on to another page's address).
    if (data && "twoFactorRedirect" in data && data.twoFactorRedirect) {
      if (sameSitePath(returnTo)) setSecondStep(true);
      else window.location.assign(`/${locale}/two-factor`);
      return;
    }
    // The server sends each role on to its own home, unless a page asked to come back.
    window.location.assign(sameSitePath(returnTo) ?? `/${locale}/home`);
  });

  if (secondStep) return <TwoFactorCodeForm returnTo={returnTo} />;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <ErrorAlert message={formError} />
      <Field
        label={t("email")}
        type="email"
        autoComplete="username"
        inputMode="email"
        errors={errors.email ? [tErrors("email_invalid")] : undefined}
        {...register("email")}
      />
      <PasswordField purpose="current" label={t("password")} errors={errors.password ? [t("passwordRequired")] : undefined} {...register("password")} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
        {isSubmitting ? t("signingIn") : t("submit")}
      </Button>
    </form>
  );
}
