"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { closeRecordSchema, type CloseRecordInput } from "@/lib/validations/admin-patient";

/** Closing a record: a reason, a confirmation, then read-only until the retention job removes it. */
export function CloseRecordForm({ patientId, name }: { patientId: string; name: string }) {
  const t = useTranslations("AdminPatients");
  const tc = useTranslations("Common");
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<CloseRecordInput>({ resolver: zodResolver(closeRecordSchema), defaultValues: { reason: "" } });
  const failure = useSubmitFailure("AdminPatients", setError);

  if (!open) {
    return (
      <div className="self-end">
        <Button variant="secondary" onClick={() => setOpen(true)} aria-label={t("closeFor", { name })}>
          {t("close")}
        </Button>
      </div>
    );
  }
  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={handleSubmit(async (values) => {
        failure.clear();
        if (!window.confirm(t("closeConfirm", { name }))) return;
        try {
          await apiFetch(`/api/admin/patients/${patientId}/close`, { method: "POST", body: values });
          router.refresh();
        } catch (error) {
          failure.fail(error);
        }
      })}
    >
      <ErrorAlert message={failure.message} />
      <p className="text-sm">{t("closeExplain")}</p>
      <Field label={t("closeReason")} errors={failure.text.list(errors.reason)} {...register("reason")} />
      <div className="flex gap-3">
        <Button type="submit" variant="danger" disabled={isSubmitting}>
          {t("closeSubmit")}
        </Button>
        <Button variant="quiet" onClick={() => setOpen(false)}>
          {tc("cancel")}
        </Button>
      </div>
    </form>
  );
}
