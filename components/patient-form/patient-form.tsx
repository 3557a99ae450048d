"use client";
// Registering a patient (POST /api/patients) or editing their details (PATCH), with the shared
// zod schema on both sides: the client shows the same field messages the server would send.
import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useId, useState, type ReactNode } from "react";
import { useForm, type FieldErrors, type Path } from "react-hook-form";
import { useSharedErrorText } from "@/components/ui/shared-error-text";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ALLERGENS, ALLERGY_ANSWERS } from "@/lib/clinical/allergies";
import { useRouter } from "@/lib/i18n/navigation";
import { localeNames } from "@/lib/i18n/routing";
import {
  EARLIEST_BIRTH_DATE,
  patientErrorKeys,
  patientLocales,
  patientSchema,
  patientSexes,
  patientUpdateSchema,
  type PatientErrorKey,
  type PatientInput,
  type PatientValues,
} from "@/lib/validations/patient";
import { gpPracticeKeys } from "./query-keys";

export type GpPractice = { id: string; name: string; phone: string | null };
export type CareTeamOption = { id: string; name: string; kind: string; parentName: string | null };

type Props =
  | { mode: "create"; careTeamOptions: CareTeamOption[]; gpPractices: GpPractice[]; initial?: undefined; patientId?: undefined; onDone?: undefined }
  | { mode: "edit"; patientId: string; initial: PatientInput; gpPractices: GpPractice[]; careTeamOptions?: undefined; onDone: () => void };

const blank: PatientInput = {
  givenName: "",
  familyName: "",
  healthRecordNumber: "",
  dateOfBirth: "",
  sex: undefined as unknown as PatientInput["sex"],
  preferredLocale: "en",
  weightKg: null,
  allergies: { latex: "not-asked", chlorhexidine: "not-asked", lidocaine: "not-asked", other: "" },
  gpPracticeId: "",
  careTeamOrganisationIds: [],
};

const formFields = [
  "givenName",
  "familyName",
  "healthRecordNumber",
  "dateOfBirth",
  "sex",
  "preferredLocale",
  "weightKg",
  "allergies.latex",
  "allergies.chlorhexidine",
  "allergies.lidocaine",
  "allergies.other",
  "gpPracticeId",
  "careTeamOrganisationIds",
] as const;

async function loadGpPractices(): Promise<GpPractice[]> {
  const res = await fetch("/api/gp-practices");
  if (!res.ok) throw new Error(String(res.status));
  return (await res.json()).practices;
}

function todayLocal() {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}

export function PatientForm(props: Props) {
  const t = useTranslations("PatientForm");
  const tErrors = useTranslations("Errors");
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const editing = props.mode === "edit";
  const gp = useQuery({ queryKey: gpPracticeKeys.directory(), queryFn: loadGpPractices, initialData: props.gpPractices });
  const onlyTeam = props.mode === "create" && props.careTeamOptions.length === 1 ? [props.careTeamOptions[0].id] : [];

  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    formState: { errors, isSubmitting, dirtyFields },
  } = useForm<PatientInput, unknown, PatientValues>({
    // Editing leaves the care team out; the server's schema for PATCH does the same.
    resolver: zodResolver(editing ? (patientSchema.omit({ careTeamOrganisationIds: true }) as unknown as typeof patientSchema) : patientSchema),
    defaultValues: editing ? props.initial : { ...blank, careTeamOrganisationIds: onlyTeam },
    mode: "onTouched",
  });

  const range = useSharedErrorText();
  const message = (key: string | undefined): string => {
    if (!key) return t("errors.required");
    const r = range(key);
    if (r) return r;
    return (patientErrorKeys as readonly string[]).includes(key) ? t(`errors.${key as PatientErrorKey}`) : t("errors.generic");
  };
  const errorsOf = (path: string): string[] | undefined => {
    const e = path.split(".").reduce<unknown>((o, k) => (o as Record<string, unknown> | undefined)?.[k], errors as FieldErrors) as
      | { message?: string }
      | undefined;
    return e ? [message(e.message)] : undefined;
  };

  const onInvalid = () => setFormError(t("fixFields"));

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    let body: Record<string, unknown> = values;
    if (editing) {
      // Only what changed, so the audit event names the fields that were edited.
      const { careTeamOrganisationIds: _team, ...rest } = values;
      body = Object.fromEntries(Object.entries(rest).filter(([k]) => k in dirtyFields));
      if (Object.keys(body).length === 0) {
        props.onDone();
        return;
      }
    }
    let res: Response;
    try {
      res = await fetch(editing ? `/api/patients/${props.patientId}` : "/api/patients", {
        method: editing ? "PATCH" : "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      });
    } catch {
      setFormError(t("networkError"));
      return;
    }
    if (res.ok) {
      if (props.mode === "edit") {
        props.onDone();
        router.refresh();
      } else {
        const { patient } = await res.json();
        router.push(`/patients/${patient.id}`);
      }
      return;
    }
    const payload = await res.json().catch(() => null);
    const fields: Record<string, string[]> | undefined = payload?.error?.fields;
    if (fields && Object.keys(fields).length) {
      let focused = false;
      for (const [field, keys] of Object.entries(fields)) {
        if ((formFields as readonly string[]).includes(field)) {
          setError(field as Path<PatientInput>, { type: "server", message: keys[0] });
          if (!focused) {
            setFocus(field as Path<PatientInput>);
            focused = true;
          }
        }
      }
      setFormError(fields._form ? message(fields._form[0]) : t("fixFields"));
      return;
    }
    if (payload?.error?.code === "record_closed") setFormError(tErrors("record_closed"));
    else setFormError(res.status === 403 || res.status === 404 ? t("notAllowed") : t("serverError"));
  }, onInvalid);

  const today = todayLocal();
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6" data-testid="patient-form">
      {formError ? (
        <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
          {formError}
        </p>
      ) : null}

      <Section title={t("sections.person")}>
        <div className="grid gap-4 md:grid-cols-2">
          <Field label={t("givenName")} autoComplete="off" errors={errorsOf("givenName")} {...register("givenName")} />
          <Field label={t("familyName")} autoComplete="off" errors={errorsOf("familyName")} {...register("familyName")} />
          <Field
            label={t("healthRecordNumber")}
            hint={t("healthRecordNumberHint")}
            autoComplete="off"
            spellCheck={false}
            className="tabular"
            errors={errorsOf("healthRecordNumber")}
            {...register("healthRecordNumber")}
          />
          <Field
            label={t("dateOfBirth")}
            type="date"
            min={EARLIEST_BIRTH_DATE}
            max={today}
            errors={errorsOf("dateOfBirth")}
            {...register("dateOfBirth")}
          />
        </div>
        <ChoiceGroup legend={t("sex")} errors={errorsOf("sex")}>
          {patientSexes.map((s) => (
            <label key={s} className="flex min-h-11 items-center gap-2">
              <input type="radio" value={s} className="h-5 w-5 accent-brand" {...register("sex")} />
              {t(`sexes.${s}`)}
            </label>
          ))}
        </ChoiceGroup>
        <div className="grid gap-4 md:grid-cols-2">
          <SelectField label={t("preferredLocale")} errors={errorsOf("preferredLocale")} {...register("preferredLocale")}>
            {patientLocales.map((l) => (
              <option key={l} value={l} lang={l}>
                {localeNames[l]}
              </option>
            ))}
          </SelectField>
          <Field
            label={t("weightKg")}
            hint={t("weightHint")}
            inputMode="decimal"
            autoComplete="off"
            className="tabular"
            errors={errorsOf("weightKg")}
            {...register("weightKg")}
          />
        </div>
      </Section>

      <Section title={t("sections.allergies")} hint={t("allergiesHint")}>
        <div className="flex flex-col gap-3">
          {ALLERGENS.map((a) => (
            <ChoiceGroup key={a} legend={t(`allergy.${a}`)} errors={errorsOf(`allergies.${a}`)}>
              {ALLERGY_ANSWERS.map((answer) => (
                <label key={answer} className="flex min-h-11 items-center gap-2">
                  <input type="radio" value={answer} className="h-5 w-5 accent-brand" {...register(`allergies.${a}`)} data-testid={`allergy-${a}-${answer}`} />
                  {t(`allergyAnswer.${answer}`)}
                </label>
              ))}
            </ChoiceGroup>
          ))}
        </div>
        <Field label={t("allergyOther")} hint={t("allergyOtherHint")} errors={errorsOf("allergies.other")} {...register("allergies.other")} />
      </Section>

      <Section title={t("sections.care")}>
        <SelectField label={t("gpPractice")} errors={errorsOf("gpPracticeId")} {...register("gpPracticeId")}>
          <option value="">{t("gpChoose")}</option>
          {(gp.data ?? []).map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        {props.mode === "create" ? (
          <ChoiceGroup legend={t("careTeam")} hint={t("careTeamHint")} errors={errorsOf("careTeamOrganisationIds")}>
            {props.careTeamOptions.map((o) => (
              <label key={o.id} className="flex min-h-11 items-center gap-3">
                <input type="checkbox" value={o.id} className="h-5 w-5 accent-brand" {...register("careTeamOrganisationIds")} />
                <span>
                  {o.name}
                  {o.parentName ? <span className="text-ink-soft"> · {o.parentName}</span> : null}
                </span>
              </label>
            ))}
          </ChoiceGroup>
        ) : null}
      </Section>

      <div className="flex flex-wrap gap-3">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? t("saving") : editing ? t("saveChanges") : t("submit")}
        </Button>
        {props.mode === "edit" ? (
          <Button variant="secondary" onClick={props.onDone} disabled={isSubmitting}>
            {t("cancel")}
          </Button>
        ) : null}
      </div>
    </form>
  );
}

function Section({ title, hint, children }: { title: string; hint?: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-4 rounded-card border border-stone-faint bg-paper-raised p-5">
      <legend className="px-1 text-xl font-bold">{title}</legend>
      {hint ? <p className="-mt-2 text-sm text-ink-soft">{hint}</p> : null}
      {children}
    </fieldset>
  );
}

function ChoiceGroup({ legend, hint, errors, children }: { legend: string; hint?: string; errors?: string[]; children: ReactNode }) {
  const id = useId();
  return (
    <fieldset className="flex flex-col gap-1" aria-describedby={errors ? `${id}-error` : undefined} aria-invalid={errors ? true : undefined}>
      <legend className="font-bold">{legend}</legend>
      {hint ? <p className="text-sm text-ink-soft">{hint}</p> : null}
      <div className={`flex flex-wrap gap-x-6 ${errors ? "rounded-lg border-2 border-level-emergency px-3" : ""}`}>{children}</div>
      {errors ? (
        <p id={`${id}-error`} role="alert" className="text-sm font-bold text-level-emergency-ink">
          {errors.join(" ")}
        </p>
      ) : null}
    </fieldset>
  );
}

function SelectField({
  label,
  errors,
  children,
  ...select
}: React.SelectHTMLAttributes<HTMLSelectElement> & { label: string; errors?: string[]; ref?: React.Ref<HTMLSelectElement> }) {
  const id = useId();
  const invalid = Boolean(errors?.length);
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      <select
        id={id}
        aria-invalid={invalid || undefined}
        aria-describedby={invalid ? `${id}-error` : undefined}
        className={`min-h-12 rounded-lg border-2 bg-paper-raised px-3 ${invalid ? "border-level-emergency" : "border-stone-line"}`}
        {...select}
      >
        {children}
      </select>
      {invalid ? (
        <p id={`${id}-error`} role="alert" className="text-sm font-bold text-level-emergency-ink">
          {errors!.join(" ")}
        </p>
      ) : null}
    </div>
  );
}
