"use client";
// The discharge checklist's fields, shared by the referral form and the checklist on its own.
// Kept as plain state: the server validates and its field errors come back under `checklist.*`.
import { useTranslations } from "next-intl";
import { Checkbox, ChoiceGroup } from "@/components/ui/choice";
import { Field, TextArea } from "@/components/ui/field";
import { DISCHARGE_TEACHING, DRAINAGE_KINDS } from "@/lib/clinical";

export type ChecklistState = {
  taught: string[];
  suppliesGiven: boolean | null;
  suppliesDays: string;
  drainage: string;
  plannedTwocOn: string;
  firstVisitOn: string;
  portalActivationGiven: boolean | null;
  notes: string;
};

export const emptyChecklist: ChecklistState = {
  taught: [],
  suppliesGiven: null,
  suppliesDays: "",
  drainage: "",
  plannedTwocOn: "",
  firstVisitOn: "",
  portalActivationGiven: null,
  notes: "",
};

/** The request body: unanswered yes/no questions are sent as missing, so the server names them. */
export function checklistBody(c: ChecklistState) {
  return {
    taught: c.taught,
    ...(c.suppliesGiven === null ? {} : { suppliesGiven: c.suppliesGiven }),
    suppliesDays: c.suppliesGiven ? c.suppliesDays : "",
    drainage: c.drainage,
    plannedTwocOn: c.plannedTwocOn,
    firstVisitOn: c.firstVisitOn,
    ...(c.portalActivationGiven === null ? {} : { portalActivationGiven: c.portalActivationGiven }),
    notes: c.notes,
  };
}

export function ChecklistFields({ value, onChange, errors }: { value: ChecklistState; onChange: (c: ChecklistState) => void; errors: (path: string) => string[] | undefined }) {
  const t = useTranslations("Transfer.checklist");
  const set = <K extends keyof ChecklistState>(key: K, v: ChecklistState[K]) => onChange({ ...value, [key]: v });
  const yesNo = (key: "suppliesGiven" | "portalActivationGiven", legend: string, testId: string) => (
    <ChoiceGroup legend={legend} errors={errors(key)}>
      <div className="flex flex-wrap gap-x-6" data-testid={testId}>
        {([true, false] as const).map((b) => (
          <label key={String(b)} className="flex min-h-12 cursor-pointer items-center gap-3">
            <input type="radio" name={key} className="h-6 w-6 accent-brand" checked={value[key] === b} onChange={() => set(key, b)} value={b ? "yes" : "no"} />
            <span>{b ? t("yes") : t("no")}</span>
          </label>
        ))}
      </div>
    </ChoiceGroup>
  );
  return (
    <div className="flex flex-col gap-4" data-testid="checklist-fields">
      <ChoiceGroup legend={t("taught")} hint={t("taughtHint")} errors={errors("taught")}>
        {DISCHARGE_TEACHING.map((item) => (
          <Checkbox
            key={item}
            label={t(`items.${item}`)}
            name="taught"
            value={item}
            checked={value.taught.includes(item)}
            onChange={(e) => set("taught", e.target.checked ? [...value.taught, item] : value.taught.filter((x) => x !== item))}
          />
        ))}
      </ChoiceGroup>
      {yesNo("suppliesGiven", t("suppliesGiven"), "checklist-supplies")}
      {value.suppliesGiven ? (
        <Field label={t("suppliesDays")} inputMode="numeric" className="max-w-xs" value={value.suppliesDays} onChange={(e) => set("suppliesDays", e.target.value)} errors={errors("suppliesDays")} name="suppliesDays" />
      ) : null}
      <ChoiceGroup legend={t("drainage")} errors={errors("drainage")}>
        <div className="flex flex-wrap gap-x-6">
          {DRAINAGE_KINDS.map((k) => (
            <label key={k} className="flex min-h-12 cursor-pointer items-center gap-3">
              <input type="radio" name="drainage" className="h-6 w-6 accent-brand" value={k} checked={value.drainage === k} onChange={() => set("drainage", k)} />
              <span>{t(`drainageKind.${k}`)}</span>
            </label>
          ))}
        </div>
      </ChoiceGroup>
      <div className="grid gap-4 md:grid-cols-2">
        <Field label={t("plannedTwocOn")} hint={t("plannedTwocHint")} type="date" name="plannedTwocOn" value={value.plannedTwocOn} onChange={(e) => set("plannedTwocOn", e.target.value)} errors={errors("plannedTwocOn")} />
        <Field label={t("firstVisitOn")} type="date" name="firstVisitOn" value={value.firstVisitOn} onChange={(e) => set("firstVisitOn", e.target.value)} errors={errors("firstVisitOn")} />
      </div>
      {yesNo("portalActivationGiven", t("portalActivationGiven"), "checklist-portal")}
      <TextArea label={t("notes")} name="checklistNotes" value={value.notes} onChange={(e) => set("notes", e.target.value)} errors={errors("notes")} />
    </div>
  );
}
