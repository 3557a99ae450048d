"use client";
// A change: planned or not (and why), whether need was reviewed, and the blockage pattern when
// this patient's catheters keep blocking.
import { useFormatter, useTranslations } from "next-intl";
import { Checkbox, RadioGroup } from "@/components/ui/choice";
import { SelectField, TextArea } from "@/components/ui/field";
import { Section } from "@/components/ui/section";
import { UNPLANNED_REASONS } from "@/lib/validations/episode";
import type { EpisodeFields, PreviousDevice } from "../use-device-episode-form";
import { useEpisodeOptions } from "./options";

export type BlockageHint = { typicalDwellDays: number; suggestedIntervalDays: number; blockageEpisodes: number } | null;

export function ChangeFieldset({ fields: { register, errorsOf, draft }, previous, blockage }: { fields: EpisodeFields; previous: PreviousDevice | null; blockage: BlockageHint }) {
  const t = useTranslations("EpisodeForm");
  const format = useFormatter();
  const options = useEpisodeOptions();
  return (
    <Section title={t("change.title")}>
      {previous ? (
        <p className="sm:col-span-2" data-testid="previous-device">
          {t("change.previous", {
            size: previous.sizeCh,
            balloon: previous.balloonMl,
            material: t(`option.material.${previous.material as "latex"}`),
            date: format.dateTime(new Date(previous.insertedAt), { dateStyle: "medium" }),
          })}
        </p>
      ) : null}
      <RadioGroup
        className="sm:col-span-2"
        legend={t("change.kind")}
        options={[
          { value: "planned", label: t("change.planned") },
          { value: "unplanned", label: t("change.unplanned") },
        ]}
        inputProps={register("changeKind")}
        errors={errorsOf("changeKind")}
      />
      {draft.changeKind === "unplanned" ? (
        <>
          <SelectField
            label={t("change.reason")}
            placeholder={t("choose")}
            options={options(UNPLANNED_REASONS, "unplannedReason")}
            {...register("unplannedReason", { shouldUnregister: true })}
            errors={errorsOf("unplannedReason")}
          />
          <TextArea label={t("change.notes")} hint={t("change.notesHint")} {...register("reasonNotes", { shouldUnregister: true })} errors={errorsOf("reasonNotes")} />
        </>
      ) : null}
      <Checkbox className="sm:col-span-2" label={t("change.needReviewed")} hint={t("change.needReviewedHint")} {...register("needReviewed")} />
      {blockage ? (
        <p className="rounded-lg border-2 border-finding-info bg-finding-info-soft p-3 sm:col-span-2" data-testid="blockage-hint">
          {t("change.blockage", {
            count: blockage.blockageEpisodes,
            typical: blockage.typicalDwellDays,
            suggested: blockage.suggestedIntervalDays,
          })}{" "}
          <span className="text-sm text-ink-soft">{t("findings.judgement")}</span>
        </p>
      ) : null}
    </Section>
  );
}
