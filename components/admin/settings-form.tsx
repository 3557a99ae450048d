"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { parsePlainDecimal } from "@/lib/shared/numbers";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { DoneStatus, ErrorAlert, Notice } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { BAG_INTERVALS, MATERIALS, MATERIAL_SPECS, PLAN_DEFAULTS, TWOC_DEFAULTS, type Material } from "@/lib/clinical";
import { useRouter } from "@/lib/i18n/navigation";
import { DEFAULT_REFERRAL_REMINDER_HOURS } from "@/lib/shared/referrals";
import { settingsFormSchema, type SettingsFormOutput, type SettingsFormValues } from "@/lib/validations/settings";

export type SettingsInitial = {
  emergencyNumber: string | null;
  region: string | null;
  outOfHoursServiceName: string | null;
  reviewIntervalDays: number | null;
  dueSoonDays: number | null;
  defaultMaxDwellDays: Partial<Record<Material, number>>;
  retentionDays: number | null;
  acknowledgeWithinMinutes: number | null;
  workingDayStart: string | null;
  workingDayEnd: string | null;
  outOfHoursPhone: string | null;
  referralReminderHours: number | null;
  twocVoidWindowHours: number | null;
  spareCatheters: number | null;
};

const text = { setValueAs: (v: unknown) => (typeof v === "string" && v.trim() === "" ? null : v) };
// An empty box clears the setting; anything typed goes to the schema, which takes plain decimals only.
const num = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? null : typeof v === "string" ? (parsePlainDecimal(v) ?? v) : v) };

export function SettingsForm({ initial }: { initial: SettingsInitial }) {
  const t = useTranslations("AdminSettings");
  const tc = useTranslations("Common");
  const v = useTranslations("Vocabulary");
  const router = useRouter();
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<SettingsFormValues, unknown, SettingsFormOutput>({
    resolver: zodResolver(settingsFormSchema),
    defaultValues: { ...initial, defaultMaxDwellDays: initial.defaultMaxDwellDays },
  });
  const failure = useSubmitFailure("AdminSettings", setError);
  const errorText = failure.text;

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    setSaved(false);
    try {
      await apiFetch("/api/admin/settings", { method: "PATCH", body: values });
      setSaved(true);
      router.refresh();
    } catch (error) {
      failure.fail(error);
    }
  });

  const dwellErrors = errors.defaultMaxDwellDays as Partial<Record<Material, { message?: string }>> | undefined;

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-8">
      <ErrorAlert message={failure.message} />
      <DoneStatus message={saved ? t("saved") : null} />

      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 text-xl font-bold">{t("patientsHeading")}</legend>
        <Notice tone="warn" title={t("emergencyWarningTitle")}>
          <p>{t("emergencyWarning")}</p>
        </Notice>
        {!initial.emergencyNumber ? <ErrorAlert message={t("emergencyUnset")} testId="emergency-unset" /> : null}
        <Field
          label={t("emergencyNumber")}
          hint={t("emergencyNumberHint")}
          inputMode="numeric"
          autoComplete="off"
          className="max-w-xs"
          errors={errorText.list(errors.emergencyNumber)}
          {...register("emergencyNumber", text)}
        />
        <Field
          label={t("region")}
          hint={t("regionHint")}
          autoComplete="off"
          dir="ltr"
          className="max-w-xs"
          errors={errorText.list(errors.region)}
          {...register("region", text)}
        />
        <Field
          label={t("outOfHoursServiceName")}
          hint={t("outOfHoursServiceNameHint")}
          autoComplete="off"
          errors={errorText.list(errors.outOfHoursServiceName)}
          {...register("outOfHoursServiceName", text)}
        />
        <Field
          label={t("outOfHoursPhone")}
          hint={t("outOfHoursPhoneHint")}
          type="tel"
          inputMode="tel"
          autoComplete="off"
          className="max-w-xs"
          errors={errorText.list(errors.outOfHoursPhone)}
          {...register("outOfHoursPhone", text)}
        />
        <Field
          label={t("referralReminderHours")}
          hint={t("referralReminderHoursHint", { hours: DEFAULT_REFERRAL_REMINDER_HOURS })}
          inputMode="numeric"
          className="max-w-xs"
          errors={errorText.list(errors.referralReminderHours)}
          {...register("referralReminderHours", num)}
        />
        <Field
          label={t("twocVoidWindowHours")}
          hint={t("twocVoidWindowHoursHint", { hours: TWOC_DEFAULTS.voidWindowHours.value })}
          inputMode="numeric"
          className="max-w-xs"
          errors={errorText.list(errors.twocVoidWindowHours)}
          {...register("twocVoidWindowHours", num)}
        />
        <Field
          label={t("spareCatheters")}
          hint={t("spareCathetersHint", { count: BAG_INTERVALS.spareCatheters.value })}
          inputMode="numeric"
          className="max-w-xs"
          errors={errorText.list(errors.spareCatheters)}
          {...register("spareCatheters", num)}
        />
      </fieldset>

      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 text-xl font-bold">{t("intervalsHeading")}</legend>
        <p className="text-ink-soft">{t("intervalsIntro")}</p>
        <p className="text-sm font-bold">{t("clinicalJudgement")}</p>
        <div className="grid gap-4 md:grid-cols-2">
          <Field
            label={t("reviewIntervalDays")}
            hint={t("ruleDefault", { days: PLAN_DEFAULTS.reviewIntervalDays.value })}
            inputMode="numeric"
            min={1}
            max={365}
            errors={errorText.list(errors.reviewIntervalDays)}
            {...register("reviewIntervalDays", num)}
          />
          <Field
            label={t("dueSoonDays")}
            hint={t("ruleDefault", { days: PLAN_DEFAULTS.dueSoonDays.value })}
            inputMode="numeric"
            min={0}
            max={60}
            errors={errorText.list(errors.dueSoonDays)}
            {...register("dueSoonDays", num)}
          />
        </div>
        <fieldset className="flex flex-col gap-2">
          <legend className="font-bold">{t("dwellHeading")}</legend>
          <p className="text-sm text-ink-soft">{t("dwellIntro")}</p>
          <div className="grid gap-4 md:grid-cols-2">
            {MATERIALS.map((m) => (
              <Field
                key={m}
                label={v(`material.${m}`)}
                hint={t("ruleDefault", { days: MATERIAL_SPECS[m].defaultMaxDwellDays })}
                    inputMode="numeric"
                min={1}
                max={365}
                errors={errorText.list(dwellErrors?.[m])}
                {...register(`defaultMaxDwellDays.${m}`, num)}
              />
            ))}
          </div>
        </fieldset>
      </fieldset>

      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 text-xl font-bold">{t("alertsHeading")}</legend>
        <p className="text-ink-soft">{t("alertsIntro")}</p>
        <div className="grid gap-4 md:grid-cols-3">
          <Field
            label={t("acknowledgeWithinMinutes")}
            hint={t("acknowledgeDefault")}
            inputMode="numeric"
            errors={errorText.list(errors.acknowledgeWithinMinutes)}
            {...register("acknowledgeWithinMinutes", num)}
            data-testid="setting-acknowledge-minutes"
          />
          <Field label={t("workingDayStart")} hint={t("workingDayStartDefault")} inputMode="numeric" autoComplete="off" errors={errorText.list(errors.workingDayStart)} {...register("workingDayStart", text)} />
          <Field label={t("workingDayEnd")} hint={t("workingDayEndDefault")} inputMode="numeric" autoComplete="off" errors={errorText.list(errors.workingDayEnd)} {...register("workingDayEnd", text)} />
        </div>
      </fieldset>

      <fieldset className="flex flex-col gap-4">
        <legend className="mb-2 text-xl font-bold">{t("recordsHeading")}</legend>
        <Field
          label={t("retentionDays")}
          hint={t("retentionHint")}
          inputMode="numeric"
          min={30}
          className="max-w-xs"
          errors={errorText.list(errors.retentionDays)}
          {...register("retentionDays", num)}
        />
      </fieldset>

      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? tc("saving") : t("save")}
        </Button>
      </div>
    </form>
  );
}
