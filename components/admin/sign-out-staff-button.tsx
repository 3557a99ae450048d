"use client";
import { useTranslations } from "next-intl";
import { ActionButton } from "@/components/ui/action-button";
import { apiFetch } from "@/lib/browser/api-client";

/** Signs a member of staff out on every device (their next request needs a new sign-in). */
export function SignOutStaffButton({ userId, name }: { userId: string; name: string }) {
  const t = useTranslations("AdminStaff");
  const tErrors = useTranslations("Errors");
  return (
    <ActionButton
      label={t("signOutEverywhere")}
      confirm={t("signOutConfirm", { name })}
      failedText={tErrors("generic")}
      onAction={async () => {
        const { sessionsEnded } = await apiFetch<{ sessionsEnded: number }>(`/api/admin/staff/${encodeURIComponent(userId)}/sign-out`, { method: "POST" });
        return t("signedOut", { count: sessionsEnded });
      }}
    />
  );
}
