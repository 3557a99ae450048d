"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Checkbox } from "@/components/ui/checkbox";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { SelectField } from "@/components/ui/select-field";
import { ApiError, apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { inviteStaffSchema, staffRoles, type InviteStaffFormValues, type InviteStaffInput } from "@/lib/validations/staff";
import { useErrorText } from "./use-field-errors";

type Org = { id: string; name: string };
type Result = { invitation: { email: string; expiresAt: string }; emailed: boolean };

export function InviteStaffForm({ organisations }: { organisations: Org[] }) {
  const t = useTranslations("AdminStaff");
  const errorText = useErrorText("AdminStaff");
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const [result, setResult] = useState<Result | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<InviteStaffFormValues, unknown, InviteStaffInput>({
    resolver: zodResolver(inviteStaffSchema),
    defaultValues: { email: "", name: "", role: "clinician", organisationIds: organisations.length === 1 ? [organisations[0].id] : [] },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setResult(null);
    try {
      const r = await apiFetch<Result>("/api/admin/staff/invitations", { method: "POST", body: values });
      setResult(r);
      reset({ ...values, email: "", name: "" });
      router.refresh();
    } catch (error) {
      if (error instanceof ApiError) {
        for (const [field, codes] of Object.entries(error.fields)) setError(field as keyof InviteStaffFormValues, { message: codes[0] });
      }
      setFormError(errorText.ofError(error));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-labelledby="invite-heading">
      {formError ? <Notice tone="stop" role="alert" title={formError} /> : null}
      {result ? (
        <Notice tone="ok" role="status" title={t("invited", { email: result.invitation.email })}>
          <p>{t("emailed")}</p>
        </Notice>
      ) : null}
      <div className="grid gap-4 md:grid-cols-2">
        <Field label={t("email")} type="email" inputMode="email" autoComplete="off" errors={errorText.list(errors.email)} {...register("email")} />
        <Field label={t("nameOptional")} autoComplete="off" errors={errorText.list(errors.name)} {...register("name")} />
        <SelectField label={t("role")} errors={errorText.list(errors.role)} {...register("role")}>
          {staffRoles.map((r) => (
            <option key={r} value={r}>
              {t(`roles.${r}`)}
            </option>
          ))}
        </SelectField>
      </div>
      <fieldset className="flex flex-col gap-1">
        <legend className="font-bold">{t("organisations")}</legend>
        <div className="grid gap-x-4 md:grid-cols-2">
          {organisations.map((o) => (
            <Checkbox key={o.id} value={o.id} label={o.name} {...register("organisationIds")} />
          ))}
        </div>
        {errors.organisationIds ? (
          <p className="text-sm font-bold text-level-emergency-ink" role="alert">
            {errorText.list(errors.organisationIds)?.join(" ")}
          </p>
        ) : null}
      </fieldset>
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? t("inviting") : t("invite")}
        </Button>
      </div>
    </form>
  );
}
