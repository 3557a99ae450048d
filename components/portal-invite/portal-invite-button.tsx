"use client";
import { useFormatter, useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";

type Invite = { code: string; expiresAt: string; activateUrl: string; emailed: boolean };

/**
 * Staff side, for the patient record page: make a one-time portal activation code for the
 * patient (optionally tied to their e-mail address). The code is shown once, to read out or
 * print; a new code replaces the old. Mount it where the record shows the patient's portal
 * status, e.g. <PortalInviteButton patientId={id} hasAccount={Boolean(patient.userId)} />.
 */
export function PortalInviteButton({ patientId, hasAccount }: { patientId: string; hasAccount: boolean }) {
  const t = useTranslations("PortalInvite");
  const format = useFormatter();
  const [email, setEmail] = useState("");
  const [invite, setInvite] = useState<Invite | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  if (hasAccount) return <p className="text-staff">{t("hasAccount")}</p>;

  async function create() {
    setBusy(true);
    setError(null);
    const res = await fetch(`/api/patients/${patientId}/invite`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(email ? { email } : {}) });
    setBusy(false);
    const body = await res.json().catch(() => null);
    if (!res.ok) return setError(res.status === 409 ? t("hasAccount") : res.status === 400 ? t("emailInvalid") : t("error"));
    setInvite(body);
  }

  return (
    <section className="flex flex-col gap-3 text-staff" aria-labelledby="portal-invite-title">
      <h2 id="portal-invite-title" className="text-lg font-bold">
        {t("title")}
      </h2>
      <p>{t("intro")}</p>
      <Field label={t("email")} hint={t("emailHint")} type="email" autoComplete="off" value={email} onChange={(e) => setEmail(e.target.value)} />
      <Button onClick={create} disabled={busy} data-testid="make-activation-code">
        {invite ? t("again") : t("make")}
      </Button>
      {error ? (
        <p role="alert" className="font-bold text-level-emergency-ink">
          {error}
        </p>
      ) : null}
      {invite ? (
        <div role="status" className="flex flex-col gap-2 rounded-lg border-2 border-brand bg-brand-soft p-4">
          <p>{t("codeLabel")}</p>
          <p className="text-3xl font-bold tracking-widest tabular" data-testid="activation-code">
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
