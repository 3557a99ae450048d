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
import { inviteStaffSchema, staffRoles, type InviteStaffFormValues, type InviteStaffInput } from "@/lib/validations/staff";

type Org = { id: string; name: string };
type Result = { invitation: { email: string; expiresAt: string }; emailed: boolean };

export function InviteStaffForm({ organisations }: { organisations: Org[] }) {
  const t = useTranslations("AdminStaff");
  const v = useTranslations("Vocabulary");
  const router = useRouter();
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
  const failure = useSubmitFailure("AdminStaff", setError);
  const errorText = failure.text;

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    setResult(null);
    try {
      const r = await apiFetch<Result>("/api/admin/staff/invitations", { method: "POST", body: values });
      setResult(r);
      reset({ ...values, email: "", name: "" });
      router.refresh();
    } catch (error) {
      failure.fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-labelledby="invite-heading">
      <ErrorAlert message={failure.message} />
      {result ? (
        <DoneStatus message={t("invited", { email: result.invitation.email })}>
          <p>{t("emailed")}</p>
        </DoneStatus>
      ) : null}
      <div className="grid gap-4 md:grid-cols-2">
        <Field label={t("email")} type="email" inputMode="email" autoComplete="off" errors={errorText.list(errors.email)} {...register("email")} />
        <Field label={t("nameOptional")} autoComplete="off" errors={errorText.list(errors.name)} {...register("name")} />
        <SelectField label={t("role")} errors={errorText.list(errors.role)} options={staffRoles.map((r) => ({ value: r, label: v(`role.${r}`) }))} {...register("role")} />
      </div>
      <ChoiceGroup legend={t("organisations")} errors={errorText.list(errors.organisationIds)}>
        <div className="grid gap-x-4 md:grid-cols-2">
          {organisations.map((o) => (
            <Checkbox key={o.id} value={o.id} label={o.name} {...register("organisationIds")} />
          ))}
        </div>
      </ChoiceGroup>
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? t("inviting") : t("invite")}
        </Button>
      </div>
    </form>
  );
}
