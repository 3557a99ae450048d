"use client";
// The trial without catheter planned for the catheter in place: its day and any medicine given
// before it (shown on the caseload under "Awaiting trial without catheter"), or clear it.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field, TextArea } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { twocPlanSchema } from "@/lib/validations/episode";

type Values = z.input<typeof twocPlanSchema>;

export function TwocPlanForm({ patientId, plannedOn, medicineNote }: { patientId: string; plannedOn: string | null; medicineNote: string | null }) {
  const t = useTranslations("Twoc");
  const tc = useTranslations("Common");
  const router = useRouter();
  const [saved, setSaved] = useState(false);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(twocPlanSchema) as unknown as Resolver<Values>,
    mode: "onSubmit",
    defaultValues: { plannedOn: plannedOn ?? "", medicineNote: medicineNote ?? "", clear: false },
  });
  const failure = useSubmitFailure("Twoc", setError);
  const err = (name: string) => failure.text.at(errors, name);
  const send = async (body: Values) => {
    failure.clear();
    setSaved(false);
    try {
      await apiFetch(`/api/patients/${patientId}/episodes/twoc-plan`, { method: "POST", body });
      setSaved(true);
      if (body.clear) reset({ plannedOn: "", medicineNote: "", clear: false });
      router.refresh();
    } catch (e) {
      failure.fail(e);
    }
  };
  const onSubmit = handleSubmit(send);
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" data-testid="twoc-plan-form">
      <h3 className="text-lg font-bold">{t("plan.title")}</h3>
      <div className="grid gap-3 sm:grid-cols-[minmax(10rem,14rem)_1fr]">
        <Field type="date" label={t("plan.plannedOn")} hint={t("plan.plannedOnHint")} {...register("plannedOn")} errors={err("plannedOn")} />
        <TextArea label={t("plan.medicineNote")} hint={t("plan.medicineNoteHint")} {...register("medicineNote")} errors={err("medicineNote")} />
      </div>
      <ErrorAlert message={failure.message} />
      {saved ? <DoneStatus message={t("plan.saved")} testId="twoc-plan-saved" /> : null}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" variant="secondary" disabled={isSubmitting} data-testid="twoc-plan-save">
          {isSubmitting ? tc("saving") : t("plan.save")}
        </Button>
        {plannedOn ? (
          <Button variant="quiet" disabled={isSubmitting} onClick={() => send({ clear: true })} data-testid="twoc-plan-clear">
            {t("plan.clear")}
          </Button>
        ) : null}
      </div>
    </form>
  );
}
