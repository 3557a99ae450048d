"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { useRouter } from "@/lib/i18n/navigation";
import { carerInviteSchema } from "@/lib/validations/invitations";

type Result = { email: string };

/** Invite a carer by e-mail; the link goes only to their inbox, never to this screen. */
export function InviteCarerForm({ patientId }: { patientId: string }) {
  const t = useTranslations("People.invite");
  const router = useRouter();
  const [result, setResult] = useState<Result | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof carerInviteSchema>, unknown, z.output<typeof carerInviteSchema>>({ resolver: zodResolver(carerInviteSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    const res = await fetch(`/api/patients/${patientId}/carers`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(values) });
    const body = await res.json().catch(() => null);
    if (!res.ok) {
      const code = body?.error?.fields?.email?.[0];
      setFormError(code === "own_address" ? t("ownAddress") : code === "already_linked" ? t("alreadyLinked") : t("error"));
      return;
    }
    setResult({ email: values.email });
    reset();
    router.refresh();
  });

  return (
    <div className="flex flex-col gap-4">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {formError ? (
          <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink">
            {formError}
          </p>
        ) : null}
        <Field label={t("email")} hint={t("emailHint")} type="email" inputMode="email" autoComplete="off" errors={errors.email ? [t("emailInvalid")] : undefined} {...register("email")} />
        <Button type="submit" disabled={isSubmitting} className="w-full text-lg">
          {t("submit")}
        </Button>
      </form>
      {result ? (
        <div role="status" className="flex flex-col gap-3 rounded-lg border-2 border-level-selfcare bg-level-selfcare-soft p-4 text-level-selfcare-ink" data-testid="invite-result">
          <p className="font-bold">{t("emailed", { email: result.email })}</p>
        </div>
      ) : null}
    </div>
  );
}
