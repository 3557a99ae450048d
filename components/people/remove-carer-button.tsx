"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
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
          const res = await fetch(`/api/patients/${patientId}/carers/${linkId}`, { method: "DELETE" });
          setBusy(false);
          if (!res.ok && res.status !== 404) return setError(true);
          setRemoved(true);
          router.refresh();
        }}
      >
        {t("yes")}
      </Button>
      <Button variant="secondary" onClick={() => setAsking(false)}>
        {t("no")}
      </Button>
      {error ? <p role="alert">{t("error")}</p> : null}
    </div>
  );
}
