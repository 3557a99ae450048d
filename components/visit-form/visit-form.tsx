"use client";
// Record a visit, with NEWS2 observations when taken. The score is shown as the clinician types
// (lib/clinical, the same rule the server applies again when saving).
import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, useWatch, type FieldPath } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Checkbox, RadioGroup } from "@/components/ui/choice";
import { Field, TextArea } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { Section } from "@/components/ui/section";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { CONSCIOUSNESS_LEVELS, scoreNews2 } from "@/lib/clinical";
import { Link } from "@/lib/i18n/navigation";
import { observationsSchema, visitSchema } from "@/lib/validations/visit";
import { fromLocalInputValue, toLocalInputValue } from "@/lib/browser/datetime-input";
import { News2Panel, type News2Contacts, type News2Values, type News2View } from "./news2-panel";

type Values = {
  occurredAt: string;
  notes: string;
  withObservations: boolean;
  observations: {
    respirationRate: string;
    spo2: string;
    spo2Scale: string;
    onOxygen: string;
    systolicBp: string;
    pulse: string;
    consciousness: string;
    temperatureC: string;
  };
};

type Saved = { eventId: string; observation: { news2: News2View; values: News2Values } | null; alerted: number };

function payload(v: Values) {
  return {
    occurredAt: fromLocalInputValue(v.occurredAt),
    notes: v.notes,
    ...(v.withObservations ? { observations: v.observations } : {}),
  };
}

function liveScore(o: Values["observations"]): News2View | null {
  const parsed = observationsSchema.safeParse(o);
  if (!parsed.success) return null;
  try {
    const r = scoreNews2(parsed.data);
    return { total: r.total, subscores: r.subscores, risk: r.risk, response: r.response.key };
  } catch {
    return null;
  }
}

export function VisitForm({ patientId, contacts }: { patientId: string; contacts: News2Contacts }) {
  const t = useTranslations("VisitForm");
  const tc = useTranslations("Common");
  const router = useRouter();
  const [saved, setSaved] = useState<Saved | null>(null);
  const { register, handleSubmit, setError, clearErrors, control, formState } = useForm<Values>({
    defaultValues: {
      occurredAt: toLocalInputValue(new Date().toISOString()),
      notes: "",
      withObservations: true,
      observations: { respirationRate: "", spo2: "", spo2Scale: "1", onOxygen: "false", systolicBp: "", pulse: "", consciousness: "A", temperatureC: "" },
    },
  });
  const failure = useSubmitFailure("VisitForm", setError);
  const withObs = useWatch({ control, name: "withObservations" });
  const obs = useWatch({ control, name: "observations" });
  // Recomputed on every render: the observations may come back as the same object as values change.
  const score = withObs ? liveScore(obs) : null;
  const err = (name: FieldPath<Values>) => failure.text.at(formState.errors, name);

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    clearErrors();
    const body = payload(values);
    const check = visitSchema.safeParse(body);
    if (!check.success) {
      for (const issue of check.error.issues) setError(issue.path.join(".") as FieldPath<Values>, { type: "client", message: issue.message });
      return;
    }
    try {
      setSaved(await apiFetch<Saved>(`/api/patients/${patientId}/visits`, { method: "POST", body }));
      // The page's own lists ("Earlier observations") were rendered before this visit existed.
      router.refresh();
    } catch (e) {
      failure.fail(e, (error) => (error.code === "conflict" ? t("noEpisode") : error.code === "validation_failed" ? null : t("failed")));
    }
  });

  if (saved) {
    return (
      <div className="flex max-w-3xl flex-col gap-4" data-testid="visit-saved">
        <p role="status" className="text-xl font-bold">
          {t("saved")}
        </p>
        {saved.observation ? <News2Panel score={saved.observation.news2} values={saved.observation.values} contacts={contacts} testId="news2-saved" /> : null}
        {saved.alerted > 0 ? (
          <p className="font-bold" data-testid="visit-alerted">
            {t("alerted")}
          </p>
        ) : null}
        <Link href={`/patients/${patientId}/history`} className="self-start font-bold text-brand underline underline-offset-4">
          {t("backToRecord")}
        </Link>
      </div>
    );
  }

  const num = (name: keyof Values["observations"], label: string, unit: string, decimal = false) => (
    <Field
      label={label}
      unit={unit}
      inputMode={decimal ? "decimal" : "numeric"}
      {...register(`observations.${name}`)}
      errors={err(`observations.${name}`)}
      data-testid={`obs-${name}`}
    />
  );

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-6" data-testid="visit-form">
      <Section title={t("title")}>
        <p className="sm:col-span-2">{t("intro")}</p>
        <Field label={t("occurredAt")} type="datetime-local" max={toLocalInputValue(new Date().toISOString())} {...register("occurredAt")} errors={err("occurredAt")} />
        <TextArea className="sm:col-span-2" label={t("notes")} hint={t("notesHint")} {...register("notes")} errors={err("notes")} data-testid="visit-notes" />
        <Checkbox className="sm:col-span-2" label={t("withObservations")} {...register("withObservations")} data-testid="with-observations" />
      </Section>
      {withObs ? (
        <Section title={t("scoreTitle")}>
          {num("respirationRate", t("respirationRate"), t("perMinute"))}
          {num("spo2", t("spo2"), t("percent"))}
          <RadioGroup
            className="sm:col-span-2"
            legend={t("spo2Scale")}
            options={[
              { value: "1", label: t("scale1") },
              { value: "2", label: t("scale2") },
            ]}
            inputProps={register("observations.spo2Scale")}
            errors={err("observations.spo2Scale")}
          />
          <RadioGroup
            legend={t("airOrOxygen")}
            options={[
              { value: "false", label: t("air") },
              { value: "true", label: t("oxygen") },
            ]}
            inputProps={register("observations.onOxygen")}
            errors={err("observations.onOxygen")}
          />
          {num("systolicBp", t("systolicBp"), t("mmHg"))}
          {num("pulse", t("pulse"), t("perMinute"))}
          {num("temperatureC", t("temperature"), t("celsius"), true)}
          <RadioGroup
            className="sm:col-span-2"
            legend={t("consciousness")}
            options={CONSCIOUSNESS_LEVELS.map((c) => ({ value: c, label: `${c} · ${t(`acvpu.${c}`)}` }))}
            inputProps={register("observations.consciousness")}
            errors={err("observations.consciousness")}
          />
          <div className="sm:col-span-2" aria-live="polite">
            {score ? <News2Panel score={score} contacts={contacts} /> : <p className="text-ink-soft">{t("scoreIncomplete")}</p>}
          </div>
        </Section>
      ) : null}
      <ErrorAlert message={failure.message} />
      <Button type="submit" disabled={formState.isSubmitting} className="w-full text-lg sm:w-auto sm:self-start" data-testid="visit-save">
        {formState.isSubmitting ? tc("saving") : t("save")}
      </Button>
    </form>
  );
}
