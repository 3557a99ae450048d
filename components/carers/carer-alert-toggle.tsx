"use client";
// A carer's choice to be e-mailed when the patient reports an urgent problem or an emergency.
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Checkbox } from "@/components/ui/choice";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useErrorText } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";

export function CarerAlertToggle({ patientId, givenName, initial }: { patientId: string; givenName: string; initial: boolean }) {
  const t = useTranslations("PortalReach.carers");
  const errorText = useErrorText("PortalReach");
  const [on, setOn] = useState(initial);
  const [state, setState] = useState<"idle" | "saving" | "saved" | { error: unknown }>("idle");
  async function change(next: boolean) {
    setOn(next);
    setState("saving");
    try {
      await apiFetch("/api/portal/carer-alerts", { method: "PUT", body: { patientId, on: next } });
      setState("saved");
    } catch (error) {
      setOn(!next);
      setState({ error });
    }
  }
  return (
    <div className="flex flex-col gap-2">
      <Checkbox
        label={t("alertsOn", { name: givenName })}
        checked={on}
        disabled={state === "saving"}
        onChange={(e) => void change(e.currentTarget.checked)}
        data-testid="carer-alert-toggle"
      />
      {state === "saved" ? <DoneStatus message={t("saved")} testId="carer-alert-saved" /> : null}
      {typeof state === "object" ? <ErrorAlert message={errorText.ofError(state.error)} /> : null}
    </div>
  );
}
