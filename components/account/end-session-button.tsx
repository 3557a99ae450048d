"use client";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";

/**
 * Ends one session (`sessionId`), or every other one. Ending this device's own session signs it
 * out, so it goes to the sign-in page.
 */
export function EndSessionButton({ sessionId, current = false, label }: { sessionId?: string; current?: boolean; label: string }) {
  const t = useTranslations("Sessions");
  const locale = useLocale();
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [failed, setFailed] = useState(false);
  return (
    <span className="inline-flex flex-col gap-1">
      <Button
        variant={sessionId ? "secondary" : "primary"}
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setFailed(false);
          try {
            await apiFetch(sessionId ? `/api/account/sessions/${encodeURIComponent(sessionId)}` : "/api/account/sessions", { method: "DELETE" });
            if (current) window.location.assign(`/${locale}/sign-in`);
            else router.refresh();
          } catch {
            setFailed(true);
          } finally {
            setBusy(false);
          }
        }}
      >
        {busy ? t("ending") : label}
      </Button>
      <ErrorAlert message={failed ? t("failed") : null} />
    </span>
  );
}
