"use client";
// The catheter itself: route, type, material, length, size (with millimetres) and balloon, and
// the reason for a size above the routine maximum.
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { RadioGroup } from "@/components/ui/choice";
import { Field, SelectField, TextArea } from "@/components/ui/field";
import { Section } from "@/components/ui/section";
import { CATHETER_TYPES, charriereToMm, DEVICE_RULES, LENGTH_CATEGORIES, MATERIALS, ROUTES } from "@/lib/clinical";
import type { EpisodeFields } from "../use-device-episode-form";
import { useEpisodeOptions } from "./words";

export function CatheterFieldset({ fields: { register, errorsOf, draft } }: { fields: EpisodeFields }) {
  const t = useTranslations("EpisodeForm");
  const format = useFormat();
  const options = useEpisodeOptions();
  const sizeCh = Number(draft.sizeCh);
  const routineMax = draft.route === "suprapubic" ? DEVICE_RULES.routineMaxChSuprapubic.value : DEVICE_RULES.routineMaxChUrethral.value;
  let mm: string | null = null;
  try {
    mm = draft.sizeCh ? format.number(charriereToMm(sizeCh), { minimumFractionDigits: 1 }) : null;
  } catch {
    mm = null;
  }
  return (
    <Section title={t("section.catheter")}>
      <RadioGroup legend={t("field.route")} options={options(ROUTES, "route")} inputProps={register("route")} errors={errorsOf("route")} />
      <RadioGroup legend={t("field.catheterType")} options={options(CATHETER_TYPES, "catheterType")} inputProps={register("catheterType")} errors={errorsOf("catheterType")} />
      <SelectField label={t("field.material")} placeholder={t("choose")} options={options(MATERIALS, "material")} {...register("material")} errors={errorsOf("material")} />
      <SelectField
        label={t("field.lengthCategory")}
        placeholder={t("choose")}
        options={options(LENGTH_CATEGORIES, "lengthCategory")}
        {...register("lengthCategory")}
        errors={errorsOf("lengthCategory")}
      />
      <Field
        label={t("field.sizeCh")}
        unit={t("unit.ch")}
        inputMode="numeric"
        hint={mm ? t("hint.sizeMm", { mm }) : t("hint.size")}
        className="tabular"
        {...register("sizeCh")}
        errors={errorsOf("sizeCh")}
      />
      <Field label={t("field.balloonMl")} unit={t("unit.ml")} inputMode="numeric" hint={t("hint.balloon")} {...register("balloonMl")} errors={errorsOf("balloonMl")} />
      <Field label={t("field.makerBalloonMl")} unit={t("unit.ml")} inputMode="numeric" hint={t("hint.makerBalloon")} {...register("makerBalloonMl")} errors={errorsOf("makerBalloonMl")} />
      {sizeCh > routineMax || draft.largerSizeReason ? (
        <TextArea
          label={t("field.largerSizeReason", { max: routineMax })}
          {...register("largerSizeReason")}
          errors={errorsOf("largerSizeReason")}
          data-testid="larger-size-reason"
        />
      ) : null}
    </Section>
  );
}
