"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";

export function WithdrawInvitationButton({ invitationId, email }: { invitationId: string; email: string }) {
  const t = useTranslations("AdminStaff");
  const tErrors = useTranslations("Errors");
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [failed, setFailed] = useState(false);
  return (
    <span className="inline-flex flex-col gap-1">
      <Button
        variant="quiet"
        disabled={busy}
        aria-label={t("withdrawFor", { email })}
        onClick={async () => {
          if (!window.confirm(t("withdrawConfirm", { email }))) return;
          setBusy(true);
          setFailed(false);
          try {
            await apiFetch(`/api/admin/staff/invitations/${invitationId}`, { method: "DELETE" });
            router.refresh();
          } catch {
            setFailed(true);
          } finally {
            setBusy(false);
          }
        }}
      >
        {t("withdraw")}
      </Button>
      {failed ? <ErrorAlert message={tErrors("generic")} testId="withdraw-error" /> : null}
    </span>
  );
}
