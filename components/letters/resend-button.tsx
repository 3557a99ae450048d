"use client";
import { useMutation } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useRouter } from "@/lib/i18n/navigation";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";

/** Queues the message again as a new one (POST …/resend), then reloads the list. */
export function ResendButton({ patientId, messageId, subject }: { patientId: string; messageId: string; subject: string }) {
  const t = useTranslations("Letters");
  const router = useRouter();
  const resend = useMutation({
    mutationFn: () => apiFetch(`/api/patients/${patientId}/messages/${messageId}/resend`, { method: "POST", body: {} }),
    onSuccess: () => router.refresh(),
  });
  return (
    <div className="flex flex-col items-start gap-1">
      <Button variant="secondary" onClick={() => resend.mutate()} disabled={resend.isPending} aria-label={t("resendLabel", { subject })}>
        {resend.isPending ? t("resending") : t("resend")}
      </Button>
      <p aria-live="polite" className="text-sm">
        {resend.isSuccess ? <span className="font-bold text-level-selfcare-ink">{t("resent")}</span> : null}
      </p>
      {resend.isError ? <ErrorAlert message={t("resendFailed")} testId="resend-error" /> : null}
    </div>
  );
}
