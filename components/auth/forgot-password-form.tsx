"use client";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { authClient } from "@/lib/auth/client";
import { signInSchema } from "@/lib/validations/auth";

/** Asks for a reset link; the answer is the same whether or not the address has an account. */
export function ForgotPasswordForm() {
  const t = useTranslations("PasswordReset");
  const tErrors = useTranslations("Errors");
  const locale = useLocale();
  const [email, setEmail] = useState("");
  const [sent, setSent] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (sent) return <Notice tone="ok" role="status" title={t("sent")} />;
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        if (!signInSchema.shape.email.safeParse(email).success) return setError(tErrors("email_invalid"));
        setBusy(true);
        const { error: err } = await authClient.requestPasswordReset({ email, redirectTo: `/${locale}/reset-password` });
        setBusy(false);
        if (err?.status === 429) return setError(tErrors("rate_limited"));
        setSent(true);
      }}
    >
      <Field label={t("email")} type="email" inputMode="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} errors={error ? [error] : undefined} />
      <Button type="submit" disabled={busy} className="w-full text-lg">
        {t("send")}
      </Button>
    </form>
  );
}
