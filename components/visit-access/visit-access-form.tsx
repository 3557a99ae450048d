"use client";
// The reason a visiting clinician gives before the full record opens (24 hours, logged).
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { TextArea } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { visitAccessSchema, type VisitAccessInput } from "@/lib/validations/visit-access";

export function VisitAccessForm({ token }: { token: string }) {
  const t = useTranslations("VisitAccess");
  const locale = useLocale();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<VisitAccessInput>({ resolver: zodResolver(visitAccessSchema), defaultValues: { token, reason: "" } });
  const failure = useSubmitFailure("VisitAccess", setError);
  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      const res = await apiFetch<{ patientId: string }>("/api/visit-access", { method: "POST", body: values });
      window.location.assign(`/${locale}/patients/${res.patientId}`);
    } catch (e) {
      failure.fail(e, (error) =>
        error.fields.token?.includes("check_code")
          ? t("errors.check_code")
          : error.status === 404
            ? t("errors.invalid")
            : error.status === 429
              ? t("errors.limited")
              : error.fields.reason
                ? null
                : t("errors.failed"),
      );
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <ErrorAlert message={failure.message} />
      <input type="hidden" {...register("token")} />
      <TextArea
        label={t("reason")}
        hint={t("reasonHint")}
        rows={3}
        errors={failure.text.list(errors.reason)}
        data-testid="visit-reason"
        {...register("reason")}
      />
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg" data-testid="visit-submit">
        {t("submit")}
      </Button>
    </form>
  );
}
