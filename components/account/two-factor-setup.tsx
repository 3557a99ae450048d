"use client";
import QRCode from "qrcode";
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert, Notice } from "@/components/ui/notice";
import { PasswordField } from "@/components/ui/password-field";
import { authClient } from "@/lib/auth/client";
import { totpCodeSchema } from "@/lib/validations/staff";
import { useErrorText } from "@/components/ui/use-error-text";
import { BackupCodes } from "./backup-codes";

/**
 * Setting up two-step sign-in: the password again (re-authentication, ASVS 7.5.1), then the QR
 * code or the key for an authenticator app, then one code from the app to confirm it works.
 */
export function TwoFactorSetup({ onDone }: { onDone?: () => void }) {
  const t = useTranslations("TwoFactor");
  const tErrors = useTranslations("Errors");
  const errorText = useErrorText("TwoFactor");
  const [password, setPassword] = useState("");
  const [step, setStep] = useState<"password" | "scan" | "done">("password");
  const [uri, setUri] = useState<string | null>(null);
  const [codes, setCodes] = useState<string[]>([]);
  const [svg, setSvg] = useState<string>("");
  const [code, setCode] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    if (!uri) return;
    QRCode.toString(uri, { type: "svg", margin: 1, errorCorrectionLevel: "M" }).then(setSvg, () => setSvg(""));
  }, [uri]);

  const secret = uri ? new URL(uri).searchParams.get("secret") ?? "" : "";

  if (step === "password") {
    return (
      <form
        noValidate
        className="flex max-w-md flex-col gap-4"
        onSubmit={async (e) => {
          e.preventDefault();
          setError(null);
          setBusy(true);
          const { data, error: err } = await authClient.twoFactor.enable({ password, issuer: "Caddis" });
          setBusy(false);
          if (err || !data || !("totpURI" in data) || !data.totpURI) {
            setError(err?.status === 429 ? tErrors("rate_limited") : t("wrongPassword"));
            return;
          }
          setUri(data.totpURI);
          setCodes(data.backupCodes ?? []);
          setStep("scan");
        }}
      >
        <ErrorAlert message={error} />
        <p>{t("setupIntro")}</p>
        <PasswordField purpose="current" label={t("password")} value={password} onChange={(e) => setPassword(e.target.value)} />
        <div>
          <Button type="submit" disabled={busy || !password}>
            {t("start")}
          </Button>
        </div>
      </form>
    );
  }

  if (step === "scan") {
    return (
      <form
        noValidate
        className="flex max-w-xl flex-col gap-4"
        onSubmit={async (e) => {
          e.preventDefault();
          setError(null);
          const parsed = totpCodeSchema.safeParse({ code });
          if (!parsed.success) {
            setError(errorText.one("code_format"));
            return;
          }
          setBusy(true);
          const { error: err } = await authClient.twoFactor.verifyTotp({ code: parsed.data.code });
          setBusy(false);
          if (err) {
            setError(err.status === 429 ? tErrors("rate_limited") : t("wrongCode"));
            return;
          }
          setStep("done");
        }}
      >
        <ErrorAlert message={error} />
        <ol className="flex list-decimal flex-col gap-3 ps-6">
          <li>{t("scanStep")}</li>
          <li>{t("codeStep")}</li>
        </ol>
        {svg ? (
          <div
            role="img"
            aria-label={t("qrLabel")}
            className="h-48 w-48 rounded border border-stone-faint bg-white p-2"
            dangerouslySetInnerHTML={{ __html: svg }}
          />
        ) : null}
        <div>
          <p className="font-bold">{t("manualKey")}</p>
          <p className="break-all font-mono tabular" dir="ltr" data-testid="totp-secret">
            {secret.replace(/(.{4})/g, "$1 ").trim()}
          </p>
        </div>
        <Field
          label={t("code")}
          inputMode="numeric"
          autoComplete="one-time-code"
          maxLength={6}
          value={code}
          onChange={(e) => setCode(e.target.value.replace(/\s/g, ""))}
        />
        <div>
          <Button type="submit" disabled={busy}>
            {busy ? t("checking") : t("confirm")}
          </Button>
        </div>
      </form>
    );
  }

  return (
    <div className="flex max-w-xl flex-col gap-4">
      <Notice tone="ok" role="status" title={t("enabled")} />
      <BackupCodes codes={codes} />
      {onDone ? (
        <div>
          <Button onClick={onDone}>{t("continue")}</Button>
        </div>
      ) : null}
    </div>
  );
}
