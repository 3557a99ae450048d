"use client";
// Registering a patient (POST /api/patients) or editing their details (PATCH), with the shared
// zod schema on both sides: the client shows the same field messages the server would send.
import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Checkbox, ChoiceGroup, RadioGroup } from "@/components/ui/choice";
import { Field, SelectField } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { Section } from "@/components/ui/section";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch, setServerFieldErrors } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { localeNames } from "@/lib/i18n/routing";
import { ALLERGENS, ALLERGY_ANSWERS } from "@/lib/clinical/allergies";
import {
  EARLIEST_BIRTH_DATE,
  patientLocales,
  patientSchema,
  patientSexes,
  patientUpdateSchema,
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
  return (await apiFetch<{ practices: GpPractice[] }>("/api/gp-practices")).practices;
}

function todayLocal() {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}

export function PatientForm(props: Props) {
  const t = useTranslations("PatientForm");
  const router = useRouter();
  const editing = props.mode === "edit";
  const gp = useQuery({ queryKey: gpPracticeKeys.directory(), queryFn: loadGpPractices, initialData: props.gpPractices });
  const onlyTeam = props.mode === "create" && props.careTeamOptions.length === 1 ? [props.careTeamOptions[0].id] : [];

  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting, dirtyFields },
  } = useForm<PatientInput, unknown, PatientValues>({
    // Editing leaves the care team out; the server's schema for PATCH does the same.
    resolver: zodResolver(editing ? (patientSchema.omit({ careTeamOrganisationIds: true }) as unknown as typeof patientSchema) : patientSchema),
    defaultValues: editing ? props.initial : { ...blank, careTeamOrganisationIds: onlyTeam },
    mode: "onTouched",
  });

  const failure = useSubmitFailure("PatientForm");
  const errorsOf = (path: string) => failure.text.at(errors, path);

  const onInvalid = () => failure.show(t("fixFields"));

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
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
    try {
      const saved = await apiFetch<{ patient: { id: string } }>(editing ? `/api/patients/${props.patientId}` : "/api/patients", { method: editing ? "PATCH" : "POST", body });
      if (props.mode === "edit") {
        props.onDone();
        router.refresh();
      } else router.push(`/patients/${saved.patient.id}`);
    } catch (e) {
      setServerFieldErrors(e, setError, formFields);
      failure.fail(e, (error) =>
        error.fields._form
          ? failure.text.one(error.fields._form[0])
          : Object.keys(error.fields).length
            ? t("fixFields")
            : error.code === "record_closed"
              ? failure.text.one("record_closed")
              : error.status === 0
              ? t("networkError")
              : error.status === 403 || error.status === 404
                ? t("notAllowed")
                : t("serverError"),
      );
    }
  }, onInvalid);

  const today = todayLocal();
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-6" data-testid="patient-form">
      <ErrorAlert message={failure.message} />

      <Section columns={1} title={t("sections.person")}>
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
        <RadioGroup legend={t("sex")} errors={errorsOf("sex")} options={patientSexes.map((s) => ({ value: s, label: t(`sexes.${s}`) }))} inputProps={register("sex")} />
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

      <Section columns={1} title={t("sections.allergies")} hint={t("allergiesHint")}>
        {/* Each one yes, no or "not asked yet" (the starting value): never a silent "no". */}
        <div className="flex flex-col gap-2">
          {ALLERGENS.map((a) => (
            <RadioGroup
              key={a}
              legend={t(`allergy.${a}`)}
              errors={errorsOf(`allergies.${a}`)}
              options={ALLERGY_ANSWERS.map((answer) => ({ value: answer, label: t(`allergyAnswer.${answer}`) }))}
              inputProps={register(`allergies.${a}`)}
            />
          ))}
        </div>
        <Field label={t("allergyOther")} hint={t("allergyOtherHint")} errors={errorsOf("allergies.other")} {...register("allergies.other")} />
      </Section>

      <Section columns={1} title={t("sections.care")}>
        <SelectField
          label={t("gpPractice")}
          placeholder={t("gpChoose")}
          options={(gp.data ?? []).map((p) => ({ value: p.id, label: p.name }))}
          errors={errorsOf("gpPracticeId")}
          {...register("gpPracticeId")}
        />
        {props.mode === "create" ? (
          <ChoiceGroup legend={t("careTeam")} hint={t("careTeamHint")} errors={errorsOf("careTeamOrganisationIds")}>
            {props.careTeamOptions.map((o) => (
              <Checkbox
                key={o.id}
                value={o.id}
                label={
                  <>
                    {o.name}
                    {o.parentName ? <span className="text-ink-soft"> · {o.parentName}</span> : null}
                  </>
                }
                {...register("careTeamOrganisationIds")}
              />
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
