"use client";
// The follow-up review of a patient discharged from the catheter caseload after a passed trial:
// when it took place, what was found, and another review day if one is needed.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { DateTimeField } from "@/components/ui/date-time-field";
import { Field, TextArea } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { thisMinute } from "@/lib/browser/datetime-input";
import { useRouter } from "@/lib/i18n/navigation";
import { followUpReviewSchema } from "@/lib/validations/episode";

type Values = z.input<typeof followUpReviewSchema>;

export function FollowUpReviewForm({ patientId }: { patientId: string }) {
  const t = useTranslations("Twoc");
  const tc = useTranslations("Common");
  const router = useRouter();
  const [now] = useState(thisMinute);
  const [saved, setSaved] = useState(false);
  const {
    register,
    control,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(followUpReviewSchema) as unknown as Resolver<Values>,
    mode: "onSubmit",
    defaultValues: { reviewedAt: now, notes: "", nextReviewOn: "" },
  });
  const failure = useSubmitFailure("Twoc", setError);
  const err = (name: string) => failure.text.at(errors, name);
  const onSubmit = handleSubmit(async (body) => {
    failure.clear();
    setSaved(false);
    try {
      await apiFetch(`/api/patients/${patientId}/episodes/follow-up-review`, { method: "POST", body });
      setSaved(true);
      router.refresh();
    } catch (e) {
      failure.fail(e);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" data-testid="follow-up-review-form">
      <h3 className="text-lg font-bold">{t("followUp.title")}</h3>
      <div className="grid gap-3 sm:grid-cols-[minmax(10rem,16rem)_1fr]">
        <DateTimeField control={control} name="reviewedAt" label={t("followUp.reviewedAt")} errors={err("reviewedAt")} />
        <TextArea label={t("followUp.notes")} hint={t("followUp.notesHint")} {...register("notes")} errors={err("notes")} />
        <Field className="sm:max-w-xs" type="date" label={t("followUp.nextReviewOn")} hint={t("followUp.nextReviewOnHint")} {...register("nextReviewOn")} errors={err("nextReviewOn")} />
      </div>
      <ErrorAlert message={failure.message} />
      {saved ? <DoneStatus message={t("followUp.saved")} testId="follow-up-review-saved" /> : null}
      <div>
        <Button type="submit" variant="secondary" disabled={isSubmitting} data-testid="follow-up-review-save">
          {isSubmitting ? tc("saving") : t("followUp.save")}
        </Button>
      </div>
    </form>
  );
}
