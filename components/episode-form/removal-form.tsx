"use client";
// Record the removal of the catheter in place, optionally as the start of a trial without catheter.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Checkbox } from "@/components/ui/choice";
import { DateTimeField } from "@/components/ui/date-time-field";
import { Field, SelectField, TextArea } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { Section } from "@/components/ui/section";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { thisMinute } from "@/lib/browser/datetime-input";
import { useRouter } from "@/lib/i18n/navigation";
import { REMOVAL_REASONS } from "@/lib/clinical";
import { removalSchema } from "@/lib/validations/episode";
import { useDeviceSummary, useEpisodeOptions } from "./fieldsets/words";

type Values = z.input<typeof removalSchema>;

export type CurrentDevice = { sizeCh: number; balloonMl: number; material: string; insertedAt: string; awaitingTwoc: boolean };

export function RemovalForm({ patientId, current }: { patientId: string; current: CurrentDevice }) {
  const t = useTranslations("EpisodeForm");
  const tc = useTranslations("Common");
  const router = useRouter();
  const options = useEpisodeOptions();
  const summary = useDeviceSummary();
  const [now] = useState(thisMinute);
  const {
    register,
    handleSubmit,
    control,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(removalSchema) as unknown as Resolver<Values>,
    mode: "onTouched",
    defaultValues: {
      removedAt: now,
      reason: current.awaitingTwoc ? "trial-without-catheter" : "",
      notes: "",
      startTwoc: current.awaitingTwoc,
      balloonDeflatedMl: "",
      catheterIntact: true,
    },
  });
  const failure = useSubmitFailure("EpisodeForm", setError);
  const err = (name: string) => failure.text.at(errors, name);

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      await apiFetch(`/api/patients/${patientId}/episodes/removal`, { method: "POST", body: values });
      router.push(`/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      failure.fail(e, (error) => (error.code === "conflict" ? t("conflict.removal") : null));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-6" data-testid="removal-form">
      <Section title={t("removal.title")}>
        <p className="sm:col-span-2" data-testid="current-device">
          {t("removal.current", summary(current))}
        </p>
        <DateTimeField control={control} name="removedAt" label={t("field.removedAt")} errors={err("removedAt")} />
        <SelectField
          label={t("field.removalReason")}
          placeholder={t("choose")}
          options={options(REMOVAL_REASONS, "removalReason")}
          {...register("reason")}
          errors={err("reason")}
        />
        <Field
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
      <ErrorAlert message={failure.message} />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg sm:w-auto sm:self-start" data-testid="save">
        {isSubmitting ? tc("saving") : t("save.removal")}
      </Button>
    </form>
  );
}
