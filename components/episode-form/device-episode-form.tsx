"use client";
// Record an insertion, or a change (the old catheter out and the new one in): every
// documentation field of an insertion in its fieldsets, the device checks live beside them
// (use-device-episode-form holds the state; the server checks again when saving).
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import type { PatientFacts } from "@/lib/shared/episode-checks";
import { ChangeFieldset, type BlockageHint } from "./fieldsets/change-fieldset";
import { CatheterFieldset } from "./fieldsets/catheter-fieldset";
import { InsertionFieldset, UrineFieldset } from "./fieldsets/insertion-fieldset";
import { PackagingFieldset } from "./fieldsets/packaging-fieldset";
import { PlanFieldset } from "./fieldsets/plan-fieldset";
import { FindingsPanel } from "./findings-panel";
import { useDeviceEpisodeForm, type EpisodeMode, type PlanDefaults, type PreviousDevice } from "./use-device-episode-form";

export type { BlockageHint, PlanDefaults, PreviousDevice };

export function DeviceEpisodeForm({
  mode,
  patientId,
  patient,
  clinicianName,
  previous,
  timeZone,
  blockage,
  planDefaults,
}: {
  mode: EpisodeMode;
  patientId: string;
  patient: PatientFacts;
  clinicianName: string;
  /** The catheter in place (change) or the last one (insertion after a trial): its spec prefills the form. */
  previous: PreviousDevice | null;
  timeZone: string;
  blockage: BlockageHint;
  planDefaults: PlanDefaults;
}) {
  const t = useTranslations("EpisodeForm");
  const tc = useTranslations("Common");
  const format = useFormat();
  const form = useDeviceEpisodeForm({ mode, patientId, patient, previous, timeZone, planDefaults });
  const dateOnly = (iso: string) => format.dateTime(new Date(`${iso}T12:00:00Z`), { dateStyle: "medium", timeZone: "UTC" });

  return (
    <form onSubmit={form.onSubmit} noValidate className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]" data-testid={`${mode}-form`}>
      <div className="flex min-w-0 flex-col gap-6">
        {mode === "change" ? <ChangeFieldset fields={form.fields} previous={previous} blockage={blockage} /> : null}
        <CatheterFieldset fields={form.fields} />
        <PackagingFieldset fields={form.fields} today={form.today} onScan={form.onScan} />
        <InsertionFieldset fields={form.fields} mode={mode} clinicianName={clinicianName} />
        <UrineFieldset fields={form.fields} />
        <PlanFieldset
          fields={form.fields}
          plan={form.plan}
          planBasis={form.planBasis}
          materialDwell={form.materialDwell}
          onDwellTyped={form.onDwellTyped}
          formatDate={dateOnly}
        />
      </div>

      <div className="flex flex-col gap-4 lg:sticky lg:top-4 lg:self-start">
        <FindingsPanel
          outcome={form.outcome}
          draft={form.fields.draft}
          overrides={form.overrides}
          onOverride={form.setOverride}
          overrideErrors={form.overrideErrors}
          formatDate={dateOnly}
        />
        <ErrorAlert message={form.failure} />
        <Button type="submit" disabled={form.submitting} className="w-full text-lg" data-testid="save">
          {form.submitting ? tc("saving") : t(mode === "change" ? "save.change" : "save.insertion")}
        </Button>
      </div>
    </form>
  );
}
