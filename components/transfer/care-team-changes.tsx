"use client";
// The care team afterwards: add a ward or community team, change the lead, or take your own team
// off while another remains, each with a reason that is kept in the access log.
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField, TextArea } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { usePlainForm } from "./use-plain-form";

type Team = { id: string; name: string };
type Mode = "add" | "lead" | "leave";

export function CareTeamChanges({ patientId, team, ownTeamIds, directory }: { patientId: string; team: (Team & { lead: boolean })[]; ownTeamIds: string[]; directory: Team[] }) {
  const t = useTranslations("Transfer.changes");
  const tt = useTranslations("Transfer");
  const router = useRouter();
  const form = usePlainForm();
  const [mode, setMode] = useState<Mode>("add");
  const [organisationId, setOrganisationId] = useState("");
  const [reason, setReason] = useState("");
  const [done, setDone] = useState<string | null>(null);
  const onTeam = team.map((m) => m.id);
  const options: Record<Mode, Team[]> = {
    add: directory.filter((o) => !onTeam.includes(o.id)),
    lead: team.filter((m) => !m.lead),
    // Your own team, and only while another team remains.
    leave: team.length > 1 ? team.filter((m) => ownTeamIds.includes(m.id)) : [],
  };
  const field = mode === "lead" ? "leadOrganisationId" : "organisationId";
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      data-testid="care-team-changes"
      onSubmit={(e) => {
        e.preventDefault();
        setDone(null);
        void form.run(async () => {
          const base = `/api/patients/${patientId}/care-team`;
          if (mode === "add") await apiFetch(base, { method: "POST", body: { organisationId, reason } });
          if (mode === "lead") await apiFetch(base, { method: "PATCH", body: { leadOrganisationId: organisationId, reason } });
          if (mode === "leave") await apiFetch(`${base}/${organisationId || "none"}`, { method: "DELETE", body: { reason } });
          setDone(t(`done.${mode}`));
          setOrganisationId("");
          setReason("");
          router.refresh();
        });
      }}
    >
      <ErrorAlert message={form.message} />
      <DoneStatus message={done} />
      <SelectField
        label={t("what")}
        value={mode}
        onChange={(e) => {
          setMode(e.target.value as Mode);
          setOrganisationId("");
        }}
        options={(["add", "lead", "leave"] as const).map((m) => ({ value: m, label: t(`mode.${m}`) }))}
        name="change"
      />
      {options[mode].length ? (
        <SelectField
          label={t(`which.${mode}`)}
          placeholder={tt("choose")}
          value={organisationId}
          onChange={(e) => setOrganisationId(e.target.value)}
          options={options[mode].map((o) => ({ value: o.id, label: o.name }))}
          errors={form.errors(field)}
          name="organisation"
        />
      ) : (
        <p data-testid="no-option">{t(`none.${mode}`)}</p>
      )}
      <TextArea label={t("reason")} hint={t("reasonHint")} value={reason} onChange={(e) => setReason(e.target.value)} errors={form.errors("reason")} name="reason" />
      <div>
        <Button type="submit" variant="secondary" disabled={form.busy || !options[mode].length}>
          {form.busy ? tt("sending") : t(`submit.${mode}`)}
        </Button>
      </div>
    </form>
  );
}
