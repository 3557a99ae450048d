"use client";
// The reason a visiting clinician gives before the full record opens (24 hours, logged).
import { zodResolver } from "@hookform/resolvers/zod";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { isApiError, postJson } from "@/components/episode-form/use-record";
import { Button } from "@/components/ui/button";
import { visitAccessSchema, type VisitAccessInput } from "@/lib/validations/visit-access";

export function VisitAccessForm({ token }: { token: string }) {
  const t = useTranslations("VisitAccess");
  const locale = useLocale();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<VisitAccessInput>({ resolver: zodResolver(visitAccessSchema), defaultValues: { token, reason: "" } });
  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const res = await postJson<{ patientId: string }>("/api/visit-access", values);
      window.location.assign(`/${locale}/patients/${res.patientId}`);
    } catch (e) {
      if (isApiError(e) && e.fields.reason) setError("reason", { message: e.fields.reason[0] });
      else if (isApiError(e) && e.fields.token?.includes("check_code")) setFormError(t("errors.check_code"));
      else setFormError(isApiError(e) && e.status === 404 ? t("errors.invalid") : isApiError(e) && e.status === 429 ? t("errors.limited") : t("errors.failed"));
    }
  });
  const reasonError = errors.reason?.message;
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {formError ? (
        <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
          {formError}
        </p>
      ) : null}
      <input type="hidden" {...register("token")} />
      <div className="flex flex-col gap-1">
        <label htmlFor="visit-reason" className="font-bold">
          {t("reason")}
        </label>
        <p id="visit-reason-hint" className="text-ink-soft">
          {t("reasonHint")}
        </p>
        <textarea
          id="visit-reason"
          rows={3}
          aria-invalid={reasonError ? true : undefined}
          aria-describedby={`visit-reason-hint${reasonError ? " visit-reason-error" : ""}`}
          className={`rounded-lg border-2 bg-paper-raised p-3 text-ink ${reasonError ? "border-level-emergency" : "border-stone-line"}`}
          data-testid="visit-reason"
          {...register("reason")}
        />
        {reasonError ? (
          <p id="visit-reason-error" role="alert" className="font-bold text-level-emergency-ink">
            {t.has(`errors.${reasonError}` as "errors.too_short") ? t(`errors.${reasonError}` as "errors.too_short") : t("errors.failed")}
          </p>
        ) : null}
      </div>
      <Button type="submit" disabled={isSubmitting} className="w-full text-lg" data-testid="visit-submit">
        {t("submit")}
      </Button>
    </form>
  );
}
