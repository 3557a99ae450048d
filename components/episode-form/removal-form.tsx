"use client";
// Record the removal of the catheter in place, optionally as the start of a trial without catheter.
import { zodResolver } from "@hookform/resolvers/zod";
import { useFormatter, useTranslations } from "next-intl";
import { useState } from "react";
import { Controller, get, useForm, type FieldPath, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { useSharedErrorText } from "@/components/ui/shared-error-text";
import { Button } from "@/components/ui/button";
import { useRouter } from "@/lib/i18n/navigation";
import { EPISODE_ERROR_KEYS, REMOVAL_REASONS, removalSchema } from "@/lib/validations/episode";
import { fromLocalInputValue, toLocalInputValue } from "@/lib/browser/datetime-input";
import { Checkbox, Section, Select, TextArea, TextInput } from "./controls";
import { isApiError, useRecord } from "./use-record";

type Values = z.input<typeof removalSchema>;

export type CurrentDevice = { sizeCh: number; balloonMl: number; material: string; insertedAt: string; awaitingTwoc: boolean };

export function RemovalForm({ patientId, current }: { patientId: string; current: CurrentDevice }) {
  const t = useTranslations("EpisodeForm");
  const tErrors = useTranslations("Errors");
  const range = useSharedErrorText();
  const format = useFormatter();
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const mutation = useRecord(`/api/patients/${patientId}/episodes/removal`);
  const {
    register,
    handleSubmit,
    control,
    setError,
    formState: { errors },
  } = useForm<Values>({
    resolver: zodResolver(removalSchema) as unknown as Resolver<Values>,
    mode: "onTouched",
    defaultValues: {
      removedAt: new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString(),
      reason: current.awaitingTwoc ? "trial-without-catheter" : "",
      notes: "",
      startTwoc: current.awaitingTwoc,
      balloonDeflatedMl: "",
      catheterIntact: true,
    },
  });
  const err = (name: FieldPath<Values>) => {
    const e = get(errors, name) as { message?: string } | undefined;
    if (!e) return undefined;
    const key = e.message as (typeof EPISODE_ERROR_KEYS)[number];
    return [range(key) ?? ((EPISODE_ERROR_KEYS as readonly string[]).includes(key) ? t(`errors.${key}`) : t("errors.invalid"))];
  };

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await mutation.mutateAsync(values);
      router.push(`/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      if (!isApiError(e)) return setFormError(tErrors("internal"));
      for (const [field, messages] of Object.entries(e.fields)) setError(field as FieldPath<Values>, { type: "server", message: messages[0] });
      setFormError(e.code === "conflict" ? t("conflict.removal") : tErrors(e.code as "internal"));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-6" data-testid="removal-form">
      <Section title={t("removal.title")}>
        <p className="sm:col-span-2" data-testid="current-device">
          {t("removal.current", {
            size: current.sizeCh,
            balloon: current.balloonMl,
            material: t(`option.material.${current.material as "latex"}`),
            date: format.dateTime(new Date(current.insertedAt), { dateStyle: "medium" }),
          })}
        </p>
        <Controller
          control={control}
          name="removedAt"
          render={({ field }) => (
            <TextInput
              label={t("field.removedAt")}
              type="datetime-local"
              max={toLocalInputValue(new Date().toISOString())}
              value={toLocalInputValue(field.value as string)}
              onChange={(e) => field.onChange(fromLocalInputValue(e.target.value))}
              onBlur={field.onBlur}
              name={field.name}
              ref={field.ref}
              errors={err("removedAt")}
            />
          )}
        />
        <Select
          label={t("field.removalReason")}
          placeholder={t("choose")}
          options={REMOVAL_REASONS.map((r) => ({ value: r, label: t(`option.removalReason.${r}`) }))}
          {...register("reason")}
          errors={err("reason")}
        />
        <TextInput
          label={t("field.balloonDeflatedMl")}
          unit={t("unit.ml")}
          inputMode="numeric"
          hint={t("hint.deflated", { balloon: current.balloonMl })}
          {...register("balloonDeflatedMl")}
          errors={err("balloonDeflatedMl")}
        />
        <Checkbox label={t("field.catheterIntact")} hint={t("hint.intact")} {...register("catheterIntact")} />
        <Checkbox className="sm:col-span-2" label={t("field.startTwoc")} hint={t("hint.startTwoc")} {...register("startTwoc")} data-testid="start-twoc" />
        <TextArea className="sm:col-span-2" label={t("field.notes")} {...register("notes")} errors={err("notes")} />
      </Section>
      {formError ? (
        <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
          {formError}
        </p>
      ) : null}
      <Button type="submit" disabled={mutation.isPending} className="w-full text-lg sm:w-auto sm:self-start" data-testid="save">
        {mutation.isPending ? t("saving") : t("save.removal")}
      </Button>
    </form>
  );
}
