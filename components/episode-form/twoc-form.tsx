"use client";
// Record the outcome of a trial without catheter: passed, or failed and what was done. A new
// catheter after a failed trial is recorded next, on the insertion form.
import { zodResolver } from "@hookform/resolvers/zod";
import { useFormatter, useTranslations } from "next-intl";
import { useState } from "react";
import { Controller, get, useFieldArray, useForm, type FieldPath, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { useSharedErrorText } from "@/components/ui/shared-error-text";
import { Button } from "@/components/ui/button";
import { useRouter } from "@/lib/i18n/navigation";
import { EPISODE_ERROR_KEYS, TWOC_FAILED_ACTIONS, twocSchema } from "@/lib/validations/episode";
import { fromLocalInputValue, toLocalInputValue } from "@/lib/browser/datetime-input";
import { RadioGroup, Section, Select, TextArea, TextInput } from "./controls";
import { isApiError, useRecord } from "./use-record";

type Values = z.input<typeof twocSchema>;

export function TwocForm({ patientId, removedAt }: { patientId: string; removedAt: string }) {
  const t = useTranslations("EpisodeForm");
  const tErrors = useTranslations("Errors");
  const range = useSharedErrorText();
  const format = useFormatter();
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const mutation = useRecord<{ next: "insertion" | null }>(`/api/patients/${patientId}/episodes/twoc`);
  const {
    register,
    handleSubmit,
    control,
    watch,
    setError,
    formState: { errors },
  } = useForm<Values>({
    resolver: zodResolver(twocSchema) as unknown as Resolver<Values>,
    mode: "onTouched",
    defaultValues: {
      occurredAt: new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString(),
      outcome: "",
      voids: [],
      postVoidResidualMl: "",
      failedAction: "",
      notes: "",
    },
  });
  const voids = useFieldArray({ control, name: "voids" as never });
  const outcome = watch("outcome");
  const failedAction = watch("failedAction");
  const volumes = (watch("voids") as { volumeMl?: unknown }[] | undefined) ?? [];
  const total = volumes.reduce<number>((sum, v) => sum + (Number(v?.volumeMl) > 0 ? Number(v.volumeMl) : 0), 0);
  const err = (name: string) => {
    const e = get(errors, name) as { message?: string } | undefined;
    if (!e?.message) return undefined;
    const key = e.message as (typeof EPISODE_ERROR_KEYS)[number];
    return [range(key) ?? ((EPISODE_ERROR_KEYS as readonly string[]).includes(key) ? t(`errors.${key}`) : t("errors.invalid"))];
  };

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const result = await mutation.mutateAsync(values);
      router.push(result.next === "insertion" ? `/patients/${patientId}/record/insertion` : `/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      if (!isApiError(e)) return setFormError(tErrors("internal"));
      for (const [field, messages] of Object.entries(e.fields)) setError(field as FieldPath<Values>, { type: "server", message: messages[0] });
      setFormError(e.code === "conflict" ? t("conflict.twoc") : tErrors(e.code as "internal"));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-6" data-testid="twoc-form">
      <Section title={t("twoc.title")}>
        <p className="sm:col-span-2">{t("twoc.since", { date: format.dateTime(new Date(removedAt), { dateStyle: "medium", timeStyle: "short" }) })}</p>
        <Controller
          control={control}
          name="occurredAt"
          render={({ field }) => (
            <TextInput
              label={t("field.twocAt")}
              type="datetime-local"
              max={toLocalInputValue(new Date().toISOString())}
              value={toLocalInputValue(field.value as string)}
              onChange={(e) => field.onChange(fromLocalInputValue(e.target.value))}
              onBlur={field.onBlur}
              name={field.name}
              ref={field.ref}
              errors={err("occurredAt")}
            />
          )}
        />
        <RadioGroup
          legend={t("field.twocOutcome")}
          options={[
            { value: "passed", label: t("option.twocOutcome.passed") },
            { value: "failed", label: t("option.twocOutcome.failed") },
          ]}
          inputProps={register("outcome")}
          errors={err("outcome")}
        />
        <fieldset className="flex flex-col gap-3 sm:col-span-2">
          <legend className="font-bold">{t("field.voids")}</legend>
          <p className="text-sm text-ink-soft">{t("hint.voids")}</p>
          {voids.fields.map((f, i) => (
            <div key={f.id} className="flex items-end gap-2">
              <TextInput
                className="flex-1"
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
            <Button variant="secondary" onClick={() => voids.append({ volumeMl: "" } as never)}>
              {t("twoc.addVoid")}
            </Button>
            <p className="tabular font-bold" aria-live="polite">
              {t("twoc.total", { total })}
            </p>
          </div>
        </fieldset>
        <TextInput label={t("field.postVoidResidualMl")} unit={t("unit.ml")} inputMode="numeric" hint={t("hint.residual")} {...register("postVoidResidualMl")} errors={err("postVoidResidualMl")} />
        {outcome === "failed" ? (
          <Select
            label={t("field.failedAction")}
            placeholder={t("choose")}
            options={TWOC_FAILED_ACTIONS.map((a) => ({ value: a, label: t(`option.failedAction.${a}`) }))}
            {...register("failedAction", { shouldUnregister: true })}
            errors={err("failedAction")}
          />
        ) : null}
        {outcome === "failed" && failedAction === "re-catheterised" ? (
          <p className="rounded-lg border-2 border-finding-info bg-finding-info-soft p-3 sm:col-span-2">{t("twoc.recatheterisedNext")}</p>
        ) : null}
        <TextArea className="sm:col-span-2" label={t("field.notes")} {...register("notes")} errors={err("notes")} />
      </Section>
      {formError ? (
        <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
          {formError}
        </p>
      ) : null}
      <Button type="submit" disabled={mutation.isPending} className="w-full text-lg sm:w-auto sm:self-start" data-testid="save">
        {mutation.isPending ? t("saving") : t("save.twoc")}
      </Button>
    </form>
  );
}
