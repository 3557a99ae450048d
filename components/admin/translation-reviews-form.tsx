"use client";
// Per translated language: who (a qualified medical translator) reviewed the patient texts and on
// which day. Until a language is reviewed its patient pages say so, quietly, at their foot.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { localeNames } from "@/lib/i18n/routing";
import { useRouter } from "@/lib/i18n/navigation";
import { TRANSLATED_LOCALES, translationReviewsFormSchema, type TranslatedLocale, type TranslationReview, type TranslationReviewsFormValues } from "@/lib/validations/settings";

export function TranslationReviewsForm({ initial }: { initial: Partial<Record<TranslatedLocale, TranslationReview>> }) {
  const t = useTranslations("TranslationReview");
  const tc = useTranslations("Common");
  const router = useRouter();
  const [saved, setSaved] = useState(false);
  const defaults = Object.fromEntries(
    TRANSLATED_LOCALES.map((l) => [l, { reviewerName: initial[l]?.reviewerName ?? "", reviewedOn: initial[l]?.reviewedOn ?? "" }]),
  ) as TranslationReviewsFormValues;
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<TranslationReviewsFormValues, unknown, Partial<Record<TranslatedLocale, TranslationReview>>>({
    resolver: zodResolver(translationReviewsFormSchema) as unknown as Resolver<TranslationReviewsFormValues, unknown, Partial<Record<TranslatedLocale, TranslationReview>>>,
    defaultValues: defaults,
  });
  const failure = useSubmitFailure("TranslationReview", setError);

  const onSubmit = handleSubmit(async (reviews) => {
    failure.clear();
    setSaved(false);
    try {
      await apiFetch("/api/admin/settings", { method: "PATCH", body: { translationReviews: Object.keys(reviews).length ? reviews : null } });
      setSaved(true);
      router.refresh();
    } catch (error) {
      failure.fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex max-w-3xl flex-col gap-4" data-testid="translation-reviews">
      <h2 className="text-xl font-bold">{t("heading")}</h2>
      <p className="text-ink-soft">{t("intro")}</p>
      <ErrorAlert message={failure.message} />
      <DoneStatus message={saved ? t("saved") : null} />
      {TRANSLATED_LOCALES.map((l) => (
        <fieldset key={l} className="flex flex-col gap-3 rounded-card border border-stone-faint bg-paper-raised p-4" data-testid={`review-${l}`}>
          <legend className="px-1 font-bold" lang={l}>
            {localeNames[l]}
          </legend>
          <p className="text-sm font-bold">{initial[l] ? t("statusReviewed") : t("statusNotReviewed")}</p>
          <div className="grid gap-4 md:grid-cols-2">
            <Field label={t("reviewerName")} autoComplete="off" errors={failure.text.list(errors[l]?.reviewerName)} {...register(`${l}.reviewerName`)} />
            <Field label={t("reviewedOn")} type="date" dir="ltr" errors={failure.text.list(errors[l]?.reviewedOn)} {...register(`${l}.reviewedOn`)} />
          </div>
        </fieldset>
      ))}
      <p className="text-sm text-ink-soft">{t("clearHint")}</p>
      <div>
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? tc("saving") : t("save")}
        </Button>
      </div>
    </form>
  );
}
