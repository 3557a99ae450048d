"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { closeRecordSchema, type CloseRecordInput } from "@/lib/validations/admin-patient";
import { useErrorText } from "./use-field-errors";

/** Closing a record: a reason, a confirmation, then read-only until the retention job removes it. */
export function CloseRecordForm({ patientId, name }: { patientId: string; name: string }) {
  const t = useTranslations("AdminPatients");
  const errorText = useErrorText("AdminPatients");
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<CloseRecordInput>({ resolver: zodResolver(closeRecordSchema), defaultValues: { reason: "" } });

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
        setFailure(null);
        if (!window.confirm(t("closeConfirm", { name }))) return;
        try {
          await apiFetch(`/api/admin/patients/${patientId}/close`, { method: "POST", body: values });
          router.refresh();
        } catch (error) {
          setFailure(errorText.ofError(error));
        }
      })}
    >
      {failure ? <Notice tone="stop" role="alert" title={failure} /> : null}
      <p className="text-sm">{t("closeExplain")}</p>
      <Field label={t("closeReason")} errors={errorText.list(errors.reason)} {...register("reason")} />
      <div className="flex gap-3">
        <Button type="submit" variant="danger" disabled={isSubmitting}>
          {t("closeSubmit")}
        </Button>
        <Button variant="quiet" onClick={() => setOpen(false)}>
          {t("cancel")}
        </Button>
      </div>
    </form>
  );
}
