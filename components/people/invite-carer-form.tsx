"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { carerInviteSchema } from "@/lib/validations/invitations";

type Result = { email: string };

/** Invite a carer by e-mail; the link goes only to their inbox, never to this screen. */
export function InviteCarerForm({ patientId }: { patientId: string }) {
  const t = useTranslations("People.invite");
  const router = useRouter();
  const [result, setResult] = useState<Result | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof carerInviteSchema>, unknown, z.output<typeof carerInviteSchema>>({ resolver: zodResolver(carerInviteSchema) });
  const failure = useSubmitFailure("People");

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      await apiFetch(`/api/patients/${patientId}/carers`, { method: "POST", body: values });
    } catch (error) {
      failure.fail(error, (e) => {
        const code = e.fields.email?.[0];
        return code === "own_address" ? t("ownAddress") : code === "already_linked" ? t("alreadyLinked") : t("error");
      });
      return;
    }
    setResult({ email: values.email });
    reset();
    router.refresh();
  });

  return (
    <div className="flex flex-col gap-4">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <ErrorAlert message={failure.message} />
        <Field label={t("email")} hint={t("emailHint")} type="email" inputMode="email" autoComplete="off" errors={errors.email ? [t("emailInvalid")] : undefined} {...register("email")} />
        <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
          {t("submit")}
        </Button>
      </form>
      <DoneStatus message={result ? t("emailed", { email: result.email }) : null} testId="invite-result" />
    </div>
  );
}
