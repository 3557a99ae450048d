"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert, Notice } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";

/** Signs a member of staff out on every device (their next request needs a new sign-in). */
export function SignOutStaffButton({ userId, name }: { userId: string; name: string }) {
  const t = useTranslations("AdminStaff");
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<{ tone: "ok" | "stop"; text: string } | null>(null);
  return (
    <div className="flex flex-col gap-2">
      <ErrorAlert message={result?.tone === "stop" ? result.text : null} />
      {result?.tone === "ok" ? <Notice tone="ok" role="status" title={result.text} /> : null}
      <div>
        <Button
          variant="secondary"
          disabled={busy}
          onClick={async () => {
            if (!window.confirm(t("signOutConfirm", { name }))) return;
            setBusy(true);
            setResult(null);
            try {
              const { sessionsEnded } = await apiFetch<{ sessionsEnded: number }>(`/api/admin/staff/${encodeURIComponent(userId)}/sign-out`, { method: "POST" });
              setResult({ tone: "ok", text: t("signedOut", { count: sessionsEnded }) });
            } catch {
              setResult({ tone: "stop", text: t("errors.generic") });
            } finally {
              setBusy(false);
            }
          }}
        >
          {t("signOutEverywhere")}
        </Button>
      </div>
    </div>
  );
}
