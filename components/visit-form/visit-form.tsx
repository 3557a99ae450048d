"use client";
// Record a visit, with NEWS2 observations when taken. The score is shown as the clinician types
// (lib/clinical, the same rule the server applies again when saving).
import { useTranslations } from "next-intl";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, useWatch, type FieldPath } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Checkbox, ChoiceGroup, RadioGroup } from "@/components/ui/choice";
import { Field, TextArea } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { Section } from "@/components/ui/section";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { CONSCIOUSNESS_LEVELS, scoreNews2, SITE_CONDITIONS, URINE_APPEARANCES } from "@/lib/clinical";
import { Link } from "@/lib/i18n/navigation";
import { observationsSchema, visitSchema, type VisitFindings } from "@/lib/validations/visit";
import { fromLocalInputValue, toLocalInputValue } from "@/lib/browser/datetime-input";
import { News2Panel, type News2Contacts, type News2Values, type News2View } from "./news2-panel";

type Findings = {
  draining: string;
  bypassing: string;
  urine: string[];
  site: string;
  bagChanged: boolean;
  valveChanged: boolean;
  catheterChanged: boolean;
  sampleSent: boolean;
  advice: string;
  nextVisitOn: string;
};

/** The last visit's findings as the starting point; what was changed or sent is never carried over. */
function startingFindings(last: VisitFindings | null): Findings {
  return {
    draining: last ? String(last.draining) : "",
    bypassing: last ? String(last.bypassing) : "",
    urine: last?.urine ?? [],
    site: last?.site ?? "",
    bagChanged: false,
    valveChanged: false,
    catheterChanged: false,
    sampleSent: false,
    advice: last?.advice ?? "",
    nextVisitOn: "",
  };
}

function hasFindings(f: Findings) {
  return Boolean(f.draining || f.bypassing || f.urine.length || f.site || f.bagChanged || f.valveChanged || f.catheterChanged || f.sampleSent || f.advice.trim() || f.nextVisitOn);
}

type Values = {
  occurredAt: string;
  notes: string;
  findings: Findings;
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

type Saved = { eventId: string; observation: { news2: News2View; values: News2Values } | null; alerted: number; sampleToChase: boolean; catheterChanged: boolean };

function payload(v: Values) {
  return {
    occurredAt: fromLocalInputValue(v.occurredAt),
    notes: v.notes,
    // A visit for observations only (a clinician from another team) leaves the findings untouched.
    ...(hasFindings(v.findings) ? { findings: v.findings } : {}),
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

export function VisitForm({ patientId, contacts, last }: { patientId: string; contacts: News2Contacts; last: VisitFindings | null }) {
  const t = useTranslations("VisitForm");
  const tc = useTranslations("Common");
  const tv = useTranslations("Visits");
  const router = useRouter();
  const [saved, setSaved] = useState<Saved | null>(null);
  const { register, handleSubmit, setError, clearErrors, control, formState } = useForm<Values>({
    defaultValues: {
      occurredAt: toLocalInputValue(new Date().toISOString()),
      notes: "",
      findings: startingFindings(last),
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
        {saved.catheterChanged ? (
          <Link href={`/patients/${patientId}/record/change`} className="self-start rounded-lg bg-brand px-5 py-3 font-bold text-white" data-testid="visit-go-change">
            {tv("findings.goToChange")}
          </Link>
        ) : null}
        {saved.sampleToChase ? (
          <p className="font-bold" data-testid="visit-sample-chase">
            {tv("findings.sampleOnCaseload")}
          </p>
        ) : null}
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
      <Section title={tv("findings.title")}>
        {last ? <p className="sm:col-span-2 text-sm text-ink-soft">{tv("findings.fromLast")}</p> : null}
        <RadioGroup
          legend={tv("findings.draining")}
          options={[
            { value: "true", label: tv("findings.yes") },
            { value: "false", label: tv("findings.no") },
          ]}
          inputProps={register("findings.draining")}
          errors={err("findings.draining")}
        />
        <RadioGroup
          legend={tv("findings.bypassing")}
          options={[
            { value: "true", label: tv("findings.yes") },
            { value: "false", label: tv("findings.no") },
          ]}
          inputProps={register("findings.bypassing")}
          errors={err("findings.bypassing")}
        />
        <ChoiceGroup className="sm:col-span-2" legend={tv("findings.urine")} hint={tv("findings.urineHint")} errors={err("findings.urine")}>
          <div className="flex flex-wrap gap-x-6">
            {URINE_APPEARANCES.map((u) => (
              <Checkbox key={u} label={tv(`findings.urineValues.${u}`)} value={u} {...register("findings.urine")} />
            ))}
          </div>
        </ChoiceGroup>
        <RadioGroup
          className="sm:col-span-2"
          legend={tv("findings.site")}
          options={SITE_CONDITIONS.map((c) => ({ value: c, label: tv(`findings.siteValues.${c}`) }))}
          inputProps={register("findings.site")}
          errors={err("findings.site")}
        />
        <ChoiceGroup className="sm:col-span-2" legend={tv("findings.done")}>
          <div className="grid sm:grid-cols-2">
            <Checkbox label={tv("findings.bagChanged")} {...register("findings.bagChanged")} />
            <Checkbox label={tv("findings.valveChanged")} {...register("findings.valveChanged")} />
            <Checkbox label={tv("findings.catheterChanged")} hint={tv("findings.catheterChangedHint")} {...register("findings.catheterChanged")} />
            <Checkbox label={tv("findings.sampleSent")} hint={tv("findings.sampleSentHint")} {...register("findings.sampleSent")} data-testid="finding-sample" />
          </div>
        </ChoiceGroup>
        <TextArea className="sm:col-span-2" label={tv("findings.advice")} {...register("findings.advice")} errors={err("findings.advice")} data-testid="finding-advice" />
        <Field label={tv("findings.nextVisitOn")} type="date" {...register("findings.nextVisitOn")} errors={err("findings.nextVisitOn")} data-testid="finding-next-visit" />
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
