"use client";
// The insertion as done: why, when, by whom, the gel, the attempts and how it went; then the
// urine drained.
import { useTranslations } from "next-intl";
import { Checkbox } from "@/components/ui/choice";
import { DateTimeField } from "@/components/ui/date-time-field";
import { Field, SelectField, TextArea } from "@/components/ui/field";
import { Section } from "@/components/ui/section";
import { GEL_KINDS } from "@/lib/clinical";
import type { EpisodeFields, EpisodeMode } from "../use-device-episode-form";
import { useEpisodeOptions } from "./options";

export function InsertionFieldset({ fields: { register, control, errorsOf, draft }, mode, clinicianName }: { fields: EpisodeFields; mode: EpisodeMode; clinicianName: string }) {
  const t = useTranslations("EpisodeForm");
  const options = useEpisodeOptions();
  return (
    <Section title={t("section.insertion")}>
      <TextArea className="sm:col-span-2" label={t("field.indication")} {...register("indication")} errors={errorsOf("indication")} />
      <DateTimeField
        control={control}
        name="insertedAt"
        label={t(mode === "change" ? "field.changedAt" : "field.insertedAt")}
        errors={errorsOf("insertedAt")}
        testId="field-inserted-at"
      />
      <div className="flex flex-col gap-1">
        <p className="font-bold">{t("field.insertedBy")}</p>
        <p className="flex min-h-12 items-center">{clinicianName}</p>
      </div>
      <SelectField label={t("field.gelKind")} placeholder={t("choose")} options={options(GEL_KINDS, "gelKind")} {...register("gelKind")} errors={errorsOf("gelKind")} />
      <Field
        label={t("field.gelVolumeMl")}
        unit={t("unit.ml")}
        inputMode="decimal"
        hint={t("hint.gel")}
        disabled={draft.gelKind === "none"}
        {...register("gelVolumeMl")}
        errors={errorsOf("gelVolumeMl")}
      />
      <Field label={t("field.attempts")} inputMode="numeric" {...register("attempts")} errors={errorsOf("attempts")} />
      <TextArea label={t("field.difficulties")} {...register("difficulties")} errors={errorsOf("difficulties")} />
      <TextArea label={t("field.patientReaction")} {...register("patientReaction")} errors={errorsOf("patientReaction")} />
    </Section>
  );
}

export function UrineFieldset({ fields: { register, errorsOf } }: { fields: EpisodeFields }) {
  const t = useTranslations("EpisodeForm");
  return (
    <Section title={t("section.urine")}>
      <Field label={t("field.residualUrineMl")} unit={t("unit.ml")} inputMode="numeric" {...register("residualUrineMl")} errors={errorsOf("residualUrineMl")} />
      <Field label={t("field.urineDescription")} hint={t("hint.urine")} {...register("urineDescription")} errors={errorsOf("urineDescription")} />
      <Checkbox label={t("field.specimenTaken")} {...register("specimenTaken")} />
    </Section>
  );
}
