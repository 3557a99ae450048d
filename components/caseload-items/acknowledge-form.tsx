"use client";
// Acknowledge an alert with what was done (or mark a sample's result chased). The server checks
// the team and the record again; on success the caseload is drawn again without the item.
import { useTranslations } from "next-intl";
import { useForm, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { RadioGroup } from "@/components/ui/choice";
import { TextArea } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { ACKNOWLEDGE_ACTIONS } from "@/lib/clinical";
import { useRouter } from "@/lib/i18n/navigation";

type Values = { action: string; note: string };

export function AcknowledgeForm({ patientId, itemId, sample }: { patientId: string; itemId: string; sample: boolean }) {
  const t = useTranslations("CareLoop");
  const tc = useTranslations("Common");
  const router = useRouter();
  const { register, handleSubmit, setError, control, formState } = useForm<Values>({ defaultValues: { action: "", note: "" } });
  const failure = useSubmitFailure("CareLoop", setError);
  const action = useWatch({ control, name: "action" });

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      await apiFetch(`/api/patients/${patientId}/caseload-items/${itemId}`, {
        method: "POST",
        body: { ...(values.action ? { action: values.action } : {}), note: values.note },
      });
      router.refresh();
    } catch (e) {
      failure.fail(e);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" data-testid={`acknowledge-form-${itemId}`}>
      {sample ? null : (
        <RadioGroup
          legend={t("whatWasDone")}
          options={ACKNOWLEDGE_ACTIONS.map((a) => ({ value: a, label: t(`actions.${a}`) }))}
          inputProps={register("action")}
          errors={failure.text.at(formState.errors, "action")}
        />
      )}
      <TextArea
        label={sample ? t("resultNote") : action === "other" ? t("noteRequired") : t("note")}
        {...register("note")}
        errors={failure.text.at(formState.errors, "note")}
        data-testid="acknowledge-note"
      />
      <ErrorAlert message={failure.message} />
      <Button type="submit" disabled={formState.isSubmitting} className="self-start" data-testid="acknowledge-submit">
        {formState.isSubmitting ? tc("saving") : sample ? t("markChased") : t("acknowledge")}
      </Button>
    </form>
  );
}
