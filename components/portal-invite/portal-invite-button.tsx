"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { patientInviteSchema } from "@/lib/validations/invitations";

type Invite = { code: string; expiresAt: string; activateUrl: string; emailed: boolean };

/**
 * Staff side, on the Passport tab: a one-time portal activation code for a patient who has no
 * account yet, without printing a new booklet, and sent by e-mail when an address is given. The
 * code is shown once, to read out or write down; a new code replaces the old.
 */
export function PortalInviteButton({ patientId }: { patientId: string }) {
  const t = useTranslations("PortalInvite");
  const format = useFormat();
  const [invite, setInvite] = useState<Invite | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof patientInviteSchema>, unknown, z.output<typeof patientInviteSchema>>({
    resolver: zodResolver(patientInviteSchema),
    defaultValues: { email: "" },
  });
  const failure = useSubmitFailure("PortalInvite", setError);

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    try {
      setInvite(await apiFetch<Invite>(`/api/patients/${patientId}/invite`, { method: "POST", body: values }));
    } catch (error) {
      failure.fail(error, (e) => (e.status === 409 ? t("hasAccount") : e.fields.email ? null : t("error")));
    }
  });

  return (
    <section className="flex max-w-xl flex-col gap-3" aria-labelledby="portal-invite-title" data-testid="portal-invite">
      <h3 id="portal-invite-title" className="text-xl font-bold">
        {t("title")}
      </h3>
      <p>{t("intro")}</p>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
        <Field label={t("email")} hint={t("emailHint")} type="email" inputMode="email" autoComplete="off" errors={errors.email ? [t("emailInvalid")] : undefined} {...register("email")} />
        <ErrorAlert message={failure.message} />
        <div>
          <Button type="submit" variant="secondary" disabled={isSubmitting} data-testid="make-activation-code">
            {invite ? t("again") : t("make")}
          </Button>
        </div>
      </form>
      {invite ? (
        <div role="status" className="flex flex-col gap-2 rounded-lg border-2 border-brand bg-brand-soft p-4">
          <p>{t("codeLabel")}</p>
          <p className="tabular text-3xl font-bold tracking-widest" dir="ltr" data-testid="activation-code">
            {invite.code}
          </p>
          <p>{t("where", { url: invite.activateUrl })}</p>
          <p>{t("expires", { date: format.dateTime(new Date(invite.expiresAt), { weekday: "long", day: "numeric", month: "long", year: "numeric" }) })}</p>
          <p>{invite.emailed ? t("emailed") : t("notEmailed")}</p>
          <p className="text-ink-soft">{t("once")}</p>
        </div>
      ) : null}
    </section>
  );
}
