"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch, isApiError } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";

/** Remove a carer: one tap to ask, one to confirm. It takes effect on their very next request. */
export function RemoveCarerButton({ patientId, linkId, name }: { patientId: string; linkId: string; name: string }) {
  const t = useTranslations("People.remove");
  const router = useRouter();
  const [asking, setAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState(false);
  const [removed, setRemoved] = useState(false);
  if (removed) {
    return (
      <p role="status" className="font-bold" data-testid="carer-removed">
        {t("done", { name })}
      </p>
    );
  }
  if (!asking) {
    return (
      <Button variant="secondary" className="w-full" onClick={() => setAsking(true)} data-testid="remove-carer">
        {t("button", { name })}
      </Button>
    );
  }
  return (
    <div className="flex flex-col gap-3 rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 text-level-urgent-ink" role="group" aria-labelledby={`confirm-${linkId}`}>
      <p id={`confirm-${linkId}`} className="font-bold">
        {t("question", { name })}
      </p>
      <Button
        variant="danger"
        disabled={busy}
        data-testid="confirm-remove"
        onClick={async () => {
          setBusy(true);
          try {
            await apiFetch(`/api/patients/${patientId}/carers/${linkId}`, { method: "DELETE" });
          } catch (e) {
            // Already gone is what was asked for.
            if (!isApiError(e) || e.status !== 404) {
              setBusy(false);
              return setError(true);
            }
          }
          setBusy(false);
          setRemoved(true);
          router.refresh();
        }}
      >
        {t("yes")}
      </Button>
      <Button variant="secondary" onClick={() => setAsking(false)}>
        {t("no")}
      </Button>
      {error ? <ErrorAlert message={t("error")} testId="remove-carer-error" /> : null}
    </div>
  );
}
