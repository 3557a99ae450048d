"use client";
// Refer the patient to another ward or community team: search the directory, write the handover
// note, say whether your team stays on the care team once they accept, and fill in the discharge
// checklist (it travels with the referral and stays on the record).
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { Button } from "@/components/ui/button";
import { ChoiceGroup } from "@/components/ui/choice";
import { Field, SelectField, TextArea } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { ChecklistFields, checklistBody, emptyChecklist } from "./checklist-fields";
import { usePlainForm } from "./use-plain-form";

export type DirectoryTeam = { id: string; name: string; kind: string; parentName: string | null; phone: string | null };

export function ReferralForm({
  patientId,
  ownTeams,
  onTeamIds,
  initialDirectory,
}: {
  patientId: string;
  /** The viewer's own teams on this care team (the referring team is chosen when there are several). */
  ownTeams: { id: string; name: string }[];
  /** Already on the care team: not offered. */
  onTeamIds: string[];
  initialDirectory: DirectoryTeam[];
}) {
  const t = useTranslations("Transfer");
  const kinds = useTranslations("Admin.kind");
  const router = useRouter();
  const form = usePlainForm();
  const [q, setQ] = useState("");
  const [teams, setTeams] = useState(initialDirectory);
  const [to, setTo] = useState("");
  const [from, setFrom] = useState(ownTeams.length === 1 ? ownTeams[0].id : "");
  const [note, setNote] = useState("");
  const [stays, setStays] = useState<boolean | null>(null);
  const [checklist, setChecklist] = useState(emptyChecklist);
  const [sent, setSent] = useState<string | null>(null);

  useEffect(() => {
    const controller = new AbortController();
    const timer = setTimeout(() => {
      apiFetch<{ teams: DirectoryTeam[] }>(`/api/teams?q=${encodeURIComponent(q)}`, { signal: controller.signal })
        .then((r) => setTeams(r.teams))
        .catch(() => {});
    }, 250);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [q]);

  const choices = teams.filter((o) => !onTeamIds.includes(o.id));
  const chosen = teams.find((o) => o.id === to) ?? initialDirectory.find((o) => o.id === to);

  return (
    <form
      noValidate
      className="flex flex-col gap-5"
      data-testid="referral-form"
      onSubmit={(e) => {
        e.preventDefault();
        setSent(null);
        void form.run(async () => {
          await apiFetch(`/api/patients/${patientId}/referrals`, {
            method: "POST",
            body: {
              toOrganisationId: to,
              ...(from ? { fromOrganisationId: from } : {}),
              handoverNote: note,
              ...(stays === null ? {} : { referrerStays: stays }),
              checklist: checklistBody(checklist),
            },
          });
          setSent(t("referral.sent", { team: chosen?.name ?? "" }));
          router.refresh();
        });
      }}
    >
      <ErrorAlert message={form.message} />
      <DoneStatus message={sent} testId="referral-sent" />
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-1 text-xl font-bold">{t("referral.toHeading")}</legend>
        <Field label={t("referral.search")} hint={t("referral.searchHint")} type="search" value={q} onChange={(e) => setQ(e.target.value)} name="teamSearch" autoComplete="off" />
        <ChoiceGroup legend={t("referral.to")} errors={form.errors("toOrganisationId")}>
          {choices.length ? (
            <ul className="flex flex-col" data-testid="directory">
              {choices.map((o) => (
                <li key={o.id}>
                  <label className="flex min-h-12 cursor-pointer items-center gap-3">
                    <input type="radio" name="toOrganisationId" value={o.id} checked={to === o.id} onChange={() => setTo(o.id)} className="h-6 w-6 accent-brand" />
                    <span>
                      <span className="font-bold">{o.name}</span> · {kinds(o.kind as "community_team")}
                      {o.parentName ? ` · ${o.parentName}` : ""}
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          ) : (
            <p className="py-2">{t("referral.noMatch")}</p>
          )}
        </ChoiceGroup>
        {ownTeams.length > 1 ? (
          <SelectField
            label={t("referral.from")}
            placeholder={t("choose")}
            options={ownTeams.map((o) => ({ value: o.id, label: o.name }))}
            value={from}
            onChange={(e) => setFrom(e.target.value)}
            errors={form.errors("fromOrganisationId")}
          />
        ) : null}
        <TextArea label={t("referral.note")} hint={t("referral.noteHint")} rows={4} name="handoverNote" value={note} onChange={(e) => setNote(e.target.value)} errors={form.errors("handoverNote")} />
        <ChoiceGroup legend={t("referral.stays")} errors={form.errors("referrerStays")}>
          {([true, false] as const).map((b) => (
            <label key={String(b)} className="flex min-h-12 cursor-pointer items-center gap-3">
              <input type="radio" name="referrerStays" value={b ? "stay" : "leave"} checked={stays === b} onChange={() => setStays(b)} className="h-6 w-6 accent-brand" />
              <span>{b ? t("referral.stay") : t("referral.leave")}</span>
            </label>
          ))}
        </ChoiceGroup>
      </fieldset>
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-1 text-xl font-bold">{t("checklist.title")}</legend>
        <ChecklistFields value={checklist} onChange={setChecklist} errors={(p) => form.errors(`checklist.${p}`)} />
      </fieldset>
      <div>
        <Button type="submit" disabled={form.busy} data-testid="referral-submit">
          {form.busy ? t("sending") : t("referral.submit")}
        </Button>
      </div>
    </form>
  );
}

/** The checklist on its own (no referral), e.g. a discharge home with the same team. */
export function ChecklistForm({ patientId }: { patientId: string }) {
  const t = useTranslations("Transfer");
  const router = useRouter();
  const form = usePlainForm();
  const [checklist, setChecklist] = useState(emptyChecklist);
  const [saved, setSaved] = useState(false);
  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      data-testid="checklist-form"
      onSubmit={(e) => {
        e.preventDefault();
        setSaved(false);
        void form.run(async () => {
          await apiFetch(`/api/patients/${patientId}/discharge-checklist`, { method: "POST", body: checklistBody(checklist) });
          setSaved(true);
          router.refresh();
        });
      }}
    >
      <ErrorAlert message={form.message} />
      <DoneStatus message={saved ? t("checklist.saved") : null} />
      <ChecklistFields value={checklist} onChange={setChecklist} errors={form.errors} />
      <div>
        <Button type="submit" disabled={form.busy}>
          {form.busy ? t("sending") : t("checklist.save")}
        </Button>
      </div>
    </form>
  );
}
