"use client";
// A carer's choice to be told (by e-mail, a push to her phones or a text) when the patient reports
// an urgent problem or an emergency.
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Checkbox } from "@/components/ui/choice";
import { SelectField } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useErrorText } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";

type Channel = "email" | "push" | "sms";

export function CarerAlertToggle({ patientId, givenName, initial, initialChannel = "email" }: { patientId: string; givenName: string; initial: boolean; initialChannel?: Channel }) {
  const t = useTranslations("PortalReach.carers");
  const tr = useTranslations("Reminders");
  const [channel, setChannel] = useState<Channel>(initialChannel);
  const errorText = useErrorText("PortalReach");
  const [on, setOn] = useState(initial);
  const [state, setState] = useState<"idle" | "saving" | "saved" | { error: unknown }>("idle");
  async function change(next: boolean, nextChannel: Channel = channel) {
    const before = { on, channel };
    setOn(next);
    setChannel(nextChannel);
    setState("saving");
    try {
      await apiFetch("/api/portal/carer-alerts", { method: "PUT", body: { patientId, on: next, channel: nextChannel } });
      setState("saved");
    } catch (error) {
      setOn(before.on);
      setChannel(before.channel);
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
      {on ? (
        <SelectField
          label={tr("channel")}
          value={channel}
          disabled={state === "saving"}
          options={(["email", "push", "sms"] as const).map((c) => ({ value: c, label: tr(`channels.${c}`) }))}
          onChange={(e) => void change(true, e.currentTarget.value as Channel)}
          data-testid="carer-alert-channel"
        />
      ) : null}
      {state === "saved" ? <DoneStatus message={t("saved")} testId="carer-alert-saved" /> : null}
      {typeof state === "object" ? <ErrorAlert message={errorText.ofError(state.error)} /> : null}
    </div>
  );
}
