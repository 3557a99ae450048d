"use client";
import { useTranslations } from "next-intl";
import { ActionButton } from "@/components/ui/action-button";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";

export function WithdrawInvitationButton({ invitationId, email }: { invitationId: string; email: string }) {
  const t = useTranslations("AdminStaff");
  const tErrors = useTranslations("Errors");
  const router = useRouter();
  return (
    <ActionButton
      variant="quiet"
      label={t("withdraw")}
      ariaLabel={t("withdrawFor", { email })}
      confirm={t("withdrawConfirm", { email })}
      failedText={tErrors("generic")}
      failedTestId="withdraw-error"
      onAction={async () => {
        await apiFetch(`/api/admin/staff/invitations/${invitationId}`, { method: "DELETE" });
        router.refresh();
      }}
    />
  );
}
