"use client";
import { useLocale, useTranslations } from "next-intl";
import { ActionButton } from "@/components/ui/action-button";
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
  return (
    <ActionButton
      variant={sessionId ? "secondary" : "primary"}
      label={label}
      busyLabel={t("ending")}
      failedText={t("failed")}
      onAction={async () => {
        await apiFetch(sessionId ? `/api/account/sessions/${encodeURIComponent(sessionId)}` : "/api/account/sessions", { method: "DELETE" });
        if (current) window.location.assign(`/${locale}/sign-in`);
        else router.refresh();
      }}
    />
  );
}
