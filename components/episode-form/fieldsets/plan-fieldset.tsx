"use client";
// The next change and review: the maker's maximum dwell (the material's default until the nurse
// types the maker's figure), the review interval, and the dates they give.
import { useTranslations } from "next-intl";
import { Field } from "@/components/ui/field";
import { Section } from "@/components/ui/section";
import type { PlanDatesResult } from "@/lib/clinical";
import type { EpisodeFields } from "../use-device-episode-form";

export function PlanFieldset({
  fields: { register, errorsOf },
  plan,
  planBasis,
  materialDwell,
  onDwellTyped,
  formatDate,
}: {
  fields: EpisodeFields;
  plan: PlanDatesResult | null;
  planBasis: PlanDatesResult["change"]["basis"] | null;
  materialDwell: number | null;
  onDwellTyped: () => void;
  formatDate: (iso: string) => string;
}) {
  const t = useTranslations("EpisodeForm");
  return (
    <Section title={t("section.plan")}>
      <Field
        label={t("field.maxDwellDays")}
        unit={t("unit.days")}
        inputMode="numeric"
        hint={materialDwell !== null ? t("hint.dwell", { days: materialDwell }) : t("hint.dwellNoMaterial")}
        {...register("maxDwellDays", { onChange: onDwellTyped })}
        errors={errorsOf("maxDwellDays")}
        data-testid="field-max-dwell"
      />
      <Field label={t("field.reviewIntervalDays")} unit={t("unit.days")} inputMode="numeric" hint={t("hint.review")} {...register("reviewIntervalDays")} errors={errorsOf("reviewIntervalDays")} />
      <div className="rounded-lg bg-paper-sunk p-3 sm:col-span-2" aria-live="polite" data-testid="plan-preview">
        {plan ? (
          <dl className="grid gap-1 sm:grid-cols-[auto_1fr] sm:gap-x-4">
            <dt className="font-bold">{t("plan.change")}</dt>
            <dd className="tabular">
              {formatDate(plan.change.date)} · {t("plan.afterDays", { days: plan.change.intervalDays })} · {planBasis ? t(`plan.basis.${planBasis}`) : null}
            </dd>
            <dt className="font-bold">{t("plan.review")}</dt>
            <dd className="tabular">
              {formatDate(plan.review.date)} · {t("plan.afterDays", { days: plan.review.intervalDays })}
            </dd>
          </dl>
        ) : (
          <p className="text-ink-soft">{t("plan.incomplete")}</p>
        )}
        <p className="mt-2 text-sm text-ink-soft">{t("findings.judgement")}</p>
      </div>
    </Section>
  );
}
