"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Checkbox, ChoiceGroup } from "@/components/ui/choice";
import { Field, SelectField } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { localeNames, locales } from "@/lib/i18n/routing";
import { organisationKinds, organisationSchema, type OrganisationFormValues, type OrganisationInput } from "@/lib/validations/organisation";

export function OrganisationForm({ organisationId, initial }: { organisationId?: string; initial?: OrganisationFormValues }) {
  const t = useTranslations("AdminOrganisations");
  const kinds = useTranslations("Admin.kind");
  const router = useRouter();
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<OrganisationFormValues, unknown, OrganisationInput>({
    resolver: zodResolver(organisationSchema),
    defaultValues: initial ?? { name: "", kind: "hospital_ward", parentName: "", phone: "", outOfHoursPhone: "", inboxEmail: "", locale: "en", languages: ["en"], requireTwoFactor: true, twoFactorRelaxedReason: "" },
  });
  const failure = useSubmitFailure("AdminOrganisations", setError);
  const errorText = failure.text;

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    setSaved(false);
    try {
      if (organisationId) {
        await apiFetch(`/api/admin/organisations/${organisationId}`, { method: "PATCH", body: values });
        setSaved(true);
        router.refresh();
      } else {
        await apiFetch("/api/admin/organisations", { method: "POST", body: values });
        router.push("/admin/organisations");
        router.refresh();
      }
    } catch (error) {
      failure.fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-2xl flex-col gap-4">
      <ErrorAlert message={failure.message} />
      <DoneStatus message={saved ? t("saved") : null} />
      <Field label={t("name")} autoComplete="organization" errors={errorText.list(errors.name)} {...register("name")} />
      <SelectField label={t("kind")} errors={errorText.list(errors.kind)} options={organisationKinds.map((k) => ({ value: k, label: kinds(k) }))} {...register("kind")} />
      <Field label={t("parentName")} hint={t("parentNameHint")} errors={errorText.list(errors.parentName)} {...register("parentName")} />
      <div className="grid gap-4 md:grid-cols-2">
        <Field label={t("phone")} type="tel" inputMode="tel" autoComplete="off" errors={errorText.list(errors.phone)} {...register("phone")} />
        <Field
          label={t("outOfHoursPhone")}
          hint={t("outOfHoursHint")}
          type="tel"
          inputMode="tel"
          autoComplete="off"
          errors={errorText.list(errors.outOfHoursPhone)}
          {...register("outOfHoursPhone")}
        />
      </div>
      <Field
        label={t("inboxEmail")}
        hint={t("inboxEmailHint")}
        type="email"
        inputMode="email"
        autoComplete="off"
        errors={errorText.list(errors.inboxEmail)}
        {...register("inboxEmail")}
      />
      <SelectField label={t("locale")} hint={t("localeHint")} errors={errorText.list(errors.locale)} {...register("locale")}>
        {locales.map((l) => (
          <option key={l} value={l} lang={l}>
            {localeNames[l]}
          </option>
        ))}
      </SelectField>
      <ChoiceGroup legend={t("languages")} hint={t("languagesHint")} errors={errorText.list(errors.languages)}>
        <div className="grid grid-cols-2 gap-x-4 md:grid-cols-3">
          {locales.map((l) => (
            <Checkbox key={l} value={l} label={<span lang={l}>{localeNames[l]}</span>} {...register("languages")} />
          ))}
        </div>
      </ChoiceGroup>
      <Checkbox label={t("requireTwoFactor")} hint={t("requireTwoFactorHint")} {...register("requireTwoFactor")} />
      {/* Relaxing two-step sign-in is allowed only with a reason on record. */}
      {watch("requireTwoFactor") === false ? (
        <Field
          label={t("twoFactorRelaxedReason")}
          hint={t("twoFactorRelaxedReasonHint")}
          maxLength={500}
          errors={errorText.list(errors.twoFactorRelaxedReason)}
          {...register("twoFactorRelaxedReason")}
        />
      ) : null}
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? t("saving") : organisationId ? t("save") : t("create")}
        </Button>
      </div>
    </form>
  );
}
