"use client";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { authClient } from "@/lib/auth/client";
import { sameSitePath } from "@/lib/shared/same-site-path";
import { Link } from "@/lib/i18n/navigation";
import { backupCodeSchema, totpCodeSchema } from "@/lib/validations/staff";
import { useErrorText } from "@/components/ui/use-error-text";

/**
 * The second step of signing in: the code from the authenticator app, or a backup code. Then
 * home, or `returnTo` (a same-site path) when the sign-in started on a page that wants its
 * visitor back (the passport's visit-access page shows this form in place).
 */
export function TwoFactorCodeForm({ returnTo }: { returnTo?: string } = {}) {
  const t = useTranslations("TwoFactor");
  const tErrors = useTranslations("Errors");
  const errorText = useErrorText("TwoFactor");
  const locale = useLocale();
  const [backup, setBackup] = useState(false);
  const [code, setCode] = useState("");
  const [fieldError, setFieldError] = useState<string[] | undefined>();
  const [failure, setFailure] = useState<{ text: string; expired: boolean } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setFailure(null);
    const parsed = (backup ? backupCodeSchema : totpCodeSchema).safeParse({ code });
    if (!parsed.success) {
      setFieldError(parsed.error.issues.map((i) => errorText.one(i.message)));
      return;
    }
    setFieldError(undefined);
    setBusy(true);
    const { error } = backup
      ? await authClient.twoFactor.verifyBackupCode({ code: parsed.data.code })
      : await authClient.twoFactor.verifyTotp({ code: parsed.data.code });
    setBusy(false);
    if (error) {
      const expired = error.code === "INVALID_TWO_FACTOR_COOKIE" || /cookie/i.test(error.message ?? "");
      setFailure({ text: expired ? t("expired") : error.status === 429 ? tErrors("rate_limited") : t("wrongCode"), expired });
      return;
    }
    window.location.assign(sameSitePath(returnTo) ?? `/${locale}/home`);
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <ErrorAlert message={failure?.text}>
        {failure?.expired ? (
          <Link href="/sign-in" className="font-bold underline underline-offset-4">
            {t("startAgain")}
          </Link>
        ) : null}
      </ErrorAlert>
      {backup ? (
        <Field
          key="backup"
          label={t("backupCode")}
          hint={t("backupCodeHint")}
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          value={code}
          onChange={(e) => setCode(e.target.value)}
          errors={fieldError}
          autoFocus
        />
      ) : (
        <Field
          key="totp"
          label={t("code")}
          hint={t("codeHint")}
          inputMode="numeric"
          autoComplete="one-time-code"
          pattern="[0-9]*"
          maxLength={6}
          value={code}
          onChange={(e) => setCode(e.target.value.replace(/\s/g, ""))}
          errors={fieldError}
          autoFocus
        />
      )}
      <Button type="submit" disabled={busy} className="w-full text-lg">
        {busy ? t("checking") : t("verify")}
      </Button>
      <Button
        variant="quiet"
        onClick={() => {
          setBackup(!backup);
          setCode("");
          setFieldError(undefined);
        }}
      >
        {backup ? t("useApp") : t("useBackup")}
      </Button>
    </form>
  );
}
