"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { DoneStatus, ErrorAlert, Notice } from "@/components/ui/notice";
import { PasswordField } from "@/components/ui/password-field";
import { authClient } from "@/lib/auth/client";
import { useRouter } from "@/lib/i18n/navigation";
import { BackupCodes } from "./backup-codes";
import { TwoFactorSetup } from "./two-factor-setup";

/** The account page's two-step sign-in section: set up, new backup codes, or turn off (if allowed). */
export function TwoFactorPanel({ enabled, required }: { enabled: boolean; required: boolean }) {
  const t = useTranslations("TwoFactor");
  const tc = useTranslations("Common");
  const tErrors = useTranslations("Errors");
  const router = useRouter();
  const [mode, setMode] = useState<"idle" | "setup" | "codes" | "disable">("idle");
  const [password, setPassword] = useState("");
  const [codes, setCodes] = useState<string[]>([]);
  const [message, setMessage] = useState<{ tone: "ok" | "stop"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  if (!enabled) {
    return mode === "setup" ? (
      <TwoFactorSetup onDone={() => router.refresh()} />
    ) : (
      <div className="flex flex-col gap-3">
        <p>{t("offExplain")}</p>
        <div>
          <Button onClick={() => setMode("setup")}>{t("setUp")}</Button>
        </div>
      </div>
    );
  }

  async function withPassword(action: "codes" | "disable") {
    setBusy(true);
    setMessage(null);
    if (action === "codes") {
      const { data, error } = await authClient.twoFactor.generateBackupCodes({ password });
      setBusy(false);
      if (error || !data) return setMessage({ tone: "stop", text: error?.status === 429 ? tErrors("rate_limited") : t("wrongPassword") });
      setCodes(data.backupCodes);
      setPassword("");
      setMode("idle");
      return;
    }
    const { error } = await authClient.twoFactor.disable({ password });
    setBusy(false);
    if (error) return setMessage({ tone: "stop", text: error.status === 403 ? t("requiredCannotDisable") : error.status === 429 ? tErrors("rate_limited") : t("wrongPassword") });
    setPassword("");
    setMode("idle");
    router.refresh();
  }

  return (
    <div className="flex flex-col gap-4">
      <Notice tone="ok" title={t("onExplain")} />
      {message?.tone === "stop" ? <ErrorAlert message={message.text} /> : <DoneStatus message={message?.text} />}
      <BackupCodes codes={codes} />
      {mode === "idle" ? (
        <div className="flex flex-wrap gap-3">
          <Button variant="secondary" onClick={() => setMode("codes")}>
            {t("newBackupCodes")}
          </Button>
          {required ? null : (
            <Button variant="quiet" onClick={() => setMode("disable")}>
              {t("turnOff")}
            </Button>
          )}
        </div>
      ) : (
        <form
          className="flex max-w-md flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            void withPassword(mode === "codes" ? "codes" : "disable");
          }}
        >
          <p>{mode === "codes" ? t("newBackupCodesExplain") : t("turnOffExplain")}</p>
          <PasswordField purpose="current" label={t("password")} value={password} onChange={(e) => setPassword(e.target.value)} />
          <div className="flex gap-3">
            <Button type="submit" variant={mode === "disable" ? "danger" : "primary"} disabled={busy || !password}>
              {mode === "codes" ? t("newBackupCodes") : t("turnOff")}
            </Button>
            <Button variant="quiet" onClick={() => setMode("idle")}>
              {tc("cancel")}
            </Button>
          </div>
        </form>
      )}
      {required ? <p className="text-sm text-ink-soft">{t("requiredNote")}</p> : null}
    </div>
  );
}
