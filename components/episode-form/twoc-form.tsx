"use client";
// Record the outcome of a trial without catheter: passed, failed or abandoned, the symptoms, the
// reason and what was done. A new catheter after a failed trial is recorded next, on the
// insertion form.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useState } from "react";
import { useFieldArray, useForm, useWatch, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Checkbox, ChoiceGroup, RadioGroup } from "@/components/ui/choice";
import { DateTimeField } from "@/components/ui/date-time-field";
import { Field, SelectField, TextArea } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { Section } from "@/components/ui/section";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { thisMinute } from "@/lib/browser/datetime-input";
import { useRouter } from "@/lib/i18n/navigation";
import { TWOC_FAILED_ACTIONS, TWOC_OUTCOMES, TWOC_SYMPTOMS } from "@/lib/clinical";
import { twocSchema } from "@/lib/validations/episode";
import { useEpisodeOptions } from "./fieldsets/words";

type Values = z.input<typeof twocSchema>;

export function TwocForm({ patientId, removedAt }: { patientId: string; removedAt: string }) {
  const t = useTranslations("EpisodeForm");
  const tc = useTranslations("Common");
  const format = useFormat();
  const router = useRouter();
  const options = useEpisodeOptions();
  const [now] = useState(thisMinute);
  const {
    register,
    handleSubmit,
    control,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(twocSchema) as unknown as Resolver<Values>,
    // Checked on save, then as the nurse types: never on leaving a box, where an error appearing
    // moved "Add a voided volume" away under the pointer and the click was lost.
    mode: "onSubmit",
    reValidateMode: "onChange",
    defaultValues: {
      occurredAt: now,
      outcome: "",
      voids: [],
      postVoidResidualMl: "",
      symptoms: [],
      reason: "",
      failedAction: "",
      notes: "",
      discharge: false,
      followUpReviewOn: "",
    },
  });
  const failure = useSubmitFailure("EpisodeForm", setError);
  const voids = useFieldArray({ control, name: "voids" as never });
  const outcome = useWatch({ control, name: "outcome" });
  const failedAction = useWatch({ control, name: "failedAction" });
  const discharge = useWatch({ control, name: "discharge" });
  const volumes = (useWatch({ control, name: "voids" }) as { volumeMl?: unknown }[] | undefined) ?? [];
  const total = volumes.reduce<number>((sum, v) => sum + (Number(v?.volumeMl) > 0 ? Number(v.volumeMl) : 0), 0);
  const err = (name: string) => failure.text.at(errors, name);

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      const result = await apiFetch<{ next: "insertion" | null }>(`/api/patients/${patientId}/episodes/twoc`, { method: "POST", body: values });
      router.push(result.next === "insertion" ? `/patients/${patientId}/record/insertion` : `/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      failure.fail(e, (error) => (error.code === "conflict" ? t("conflict.twoc") : null));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-6" data-testid="twoc-form">
      <Section title={t("twoc.title")}>
        <p className="sm:col-span-2">{t("twoc.since", { date: format.dateTime(new Date(removedAt), { dateStyle: "medium", timeStyle: "short" }) })}</p>
        <DateTimeField control={control} name="occurredAt" label={t("field.twocAt")} errors={err("occurredAt")} />
        <RadioGroup legend={t("field.twocOutcome")} options={options(TWOC_OUTCOMES, "twocOutcome")} inputProps={register("outcome")} errors={err("outcome")} />
        <ChoiceGroup className="sm:col-span-2" legend={t("field.voids")} hint={t("hint.voids")}>
          {voids.fields.map((f, i) => (
            <div key={f.id} className="flex flex-wrap items-end gap-2" data-testid="void-row">
              <Field
                className="w-32"
                label={t("field.voidAtN", { n: i + 1 })}
                type="time"
                {...register(`voids.${i}.at` as never)}
                errors={err(`voids.${i}.at`)}
              />
              <Field
                className="min-w-32 flex-1"
                label={t("field.voidN", { n: i + 1 })}
                unit={t("unit.ml")}
                inputMode="numeric"
                {...register(`voids.${i}.volumeMl` as never)}
                errors={err(`voids.${i}.volumeMl`)}
              />
              <Button variant="quiet" onClick={() => voids.remove(i)} aria-label={t("twoc.removeVoid", { n: i + 1 })}>
                {t("twoc.remove")}
              </Button>
            </div>
          ))}
          <div className="flex flex-wrap items-center gap-4">
            <Button variant="secondary" data-testid="add-void" onClick={() => voids.append({ at: "", volumeMl: "" } as never)}>
              {t("twoc.addVoid")}
            </Button>
            <p className="tabular font-bold" aria-live="polite">
              {t("twoc.total", { total })}
            </p>
          </div>
        </ChoiceGroup>
        <Field label={t("field.postVoidResidualMl")} unit={t("unit.ml")} inputMode="numeric" hint={t("hint.residual")} {...register("postVoidResidualMl")} errors={err("postVoidResidualMl")} />
        <ChoiceGroup className="sm:col-span-2" legend={t("field.twocSymptoms")} hint={t("hint.twocSymptoms")} errors={err("symptoms")}>
          <div className="grid gap-x-4 sm:grid-cols-2">
            {options(TWOC_SYMPTOMS, "twocSymptom").map((o) => (
              <Checkbox key={o.value} label={o.label} value={o.value} {...register("symptoms")} />
            ))}
          </div>
        </ChoiceGroup>
        {outcome === "failed" || outcome === "abandoned" ? (
          <TextArea className="sm:col-span-2" label={t("field.twocReason")} hint={t("hint.twocReason")} {...register("reason", { shouldUnregister: true })} errors={err("reason")} />
        ) : null}
        {outcome === "failed" || outcome === "abandoned" ? (
          <SelectField
            label={t("field.failedAction")}
            placeholder={t("choose")}
            options={options(TWOC_FAILED_ACTIONS, "failedAction")}
            {...register("failedAction", { shouldUnregister: true })}
            errors={err("failedAction")}
          />
        ) : null}
        {outcome !== "passed" && failedAction === "re-catheterised" ? (
          <p className="rounded-lg border-2 border-finding-info bg-finding-info-soft p-3 sm:col-span-2">{t("twoc.recatheterisedNext")}</p>
        ) : null}
        <TextArea className="sm:col-span-2" label={t("field.notes")} {...register("notes")} errors={err("notes")} />
        {outcome === "passed" ? (
          <div className="flex flex-col gap-2 sm:col-span-2" data-testid="twoc-discharge">
            <Checkbox label={t("field.discharge")} hint={t("hint.discharge")} {...register("discharge", { shouldUnregister: true })} errors={err("discharge")} />
            {discharge ? (
              <Field className="sm:max-w-xs" type="date" label={t("field.followUpReviewOn")} {...register("followUpReviewOn", { shouldUnregister: true })} errors={err("followUpReviewOn")} />
            ) : null}
          </div>
        ) : null}
      </Section>
      <ErrorAlert message={failure.message} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg sm:w-auto sm:self-start" data-testid="save">
        {isSubmitting ? tc("saving") : t("save.twoc")}
      </Button>
    </form>
  );
}
