"use client";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { NEW_PASSWORD_MIN } from "@/lib/validations/invitations";

type Mode = "accept" | "sign-in" | "create";

/** Accept a carer invitation: as the signed-in carer, with the carer account's password, or with a new account. */
export function CarerInviteForm({ token, mode, email }: { token: string; mode: Mode; email?: string }) {
  const t = useTranslations("CarerInvite");
  const locale = useLocale();
  const [name, setName] = useState("");
  const [password, setPassword] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const local: Record<string, string> = {};
    if (mode === "create" && !name.trim()) local.name = t("nameRequired");
    if (mode === "create" && password.length < NEW_PASSWORD_MIN) local.password = t("passwordShort", { min: NEW_PASSWORD_MIN });
    if (mode === "sign-in" && !password) local.password = t("passwordRequired");
    setErrors(local);
    if (Object.keys(local).length) return;
    setBusy(true);
    const body = mode === "accept" ? { token } : mode === "sign-in" ? { token, password } : { token, name: name.trim(), password };
    const res = await fetch("/api/carer-invites/accept", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    setBusy(false);
    if (res.ok) return window.location.assign(`/${locale}/today`);
    const out = await res.json().catch(() => null);
    const f = out?.error?.fields ?? {};
    if (res.status === 429) return setErrors({ form: t("tooMany") });
    if (f.password?.[0] === "wrong") return setErrors({ password: t("passwordWrong") });
    if (f.password?.[0] === "too_common") return setErrors({ password: t("passwordCommon") });
    if (f.password) return setErrors({ password: t("passwordShort", { min: NEW_PASSWORD_MIN }) });
    if (f.token) return setErrors({ form: t("invalid") });
    setErrors({ form: t("error") });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {errors.form ? (
        <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
          {errors.form}
        </p>
      ) : null}
      {email ? (
        <p>
          {t("yourEmail")} <strong className="[overflow-wrap:anywhere]">{email}</strong>
        </p>
      ) : null}
      {/* Lets password managers store the address with the new password (WCAG 3.3.8). */}
      {email && mode !== "accept" ? <input type="email" name="username" autoComplete="username" value={email} readOnly hidden /> : null}
      {mode === "create" ? (
        <Field label={t("name")} autoComplete="name" value={name} onChange={(e) => setName(e.target.value)} errors={errors.name ? [errors.name] : undefined} />
      ) : null}
      {mode !== "accept" ? (
        <Field
          label={mode === "create" ? t("newPassword") : t("password")}
          hint={mode === "create" ? t("passwordHint", { min: NEW_PASSWORD_MIN }) : undefined}
          type="password"
          autoComplete={mode === "create" ? "new-password" : "current-password"}
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          errors={errors.password ? [errors.password] : undefined}
        />
      ) : null}
      <Button type="submit" disabled={busy} className="w-full text-lg" data-testid="accept-invite">
        {mode === "create" ? t("create") : mode === "sign-in" ? t("signInAccept") : t("accept")}
      </Button>
    </form>
  );
}
