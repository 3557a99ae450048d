"use client";
// The receiving team's answer on its caseload: accept, or decline with a reason that goes back
// to the referring team.
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { TextArea } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { usePlainForm } from "./use-plain-form";

export function ReferralAnswer({ referralId, patientName }: { referralId: string; patientName: string }) {
  const t = useTranslations("Transfer.answer");
  const tt = useTranslations("Transfer");
  const router = useRouter();
  const form = usePlainForm();
  const [declining, setDeclining] = useState(false);
  const [reason, setReason] = useState("");
  const [done, setDone] = useState<string | null>(null);
  const answer = (kind: "accept" | "decline") =>
    form.run(async () => {
      await apiFetch(`/api/referrals/${referralId}/${kind}`, { method: "POST", body: kind === "decline" ? { reason } : {} });
      setDone(t(kind === "accept" ? "accepted" : "declined", { patient: patientName }));
      router.refresh();
    });
  if (done) return <DoneStatus message={done} testId="referral-answered" />;
  return (
    <div className="flex flex-col gap-3">
      <ErrorAlert message={form.message} />
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => void answer("accept")} disabled={form.busy} data-testid="referral-accept" aria-label={t("acceptFor", { patient: patientName })}>
          {t("accept")}
        </Button>
        {!declining ? (
          <Button variant="secondary" onClick={() => setDeclining(true)} data-testid="referral-decline" aria-label={t("declineFor", { patient: patientName })}>
            {t("decline")}
          </Button>
        ) : null}
      </div>
      {declining ? (
        <form
          noValidate
          className="flex flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            void answer("decline");
          }}
        >
          <TextArea label={t("reason")} hint={t("reasonHint")} value={reason} onChange={(e) => setReason(e.target.value)} errors={form.errors("reason")} name="declineReason" />
          <div className="flex flex-wrap gap-3">
            <Button type="submit" variant="secondary" disabled={form.busy} data-testid="referral-decline-send">
              {form.busy ? tt("sending") : t("declineSend")}
            </Button>
            <Button variant="quiet" onClick={() => setDeclining(false)}>
              {tt("cancel")}
            </Button>
          </div>
        </form>
      ) : null}
    </div>
  );
}

/** The referring team takes back a referral still waiting. */
export function WithdrawReferral({ patientId, referralId }: { patientId: string; referralId: string }) {
  const t = useTranslations("Transfer");
  const router = useRouter();
  const form = usePlainForm();
  return (
    <div className="flex flex-col gap-2">
      <ErrorAlert message={form.message} />
      <div>
        <Button
          variant="quiet"
          disabled={form.busy}
          onClick={() => {
            if (!window.confirm(t("withdrawConfirm"))) return;
            void form.run(async () => {
              await apiFetch(`/api/patients/${patientId}/referrals/${referralId}/withdraw`, { method: "POST", body: {} });
              router.refresh();
            });
          }}
        >
          {t("withdraw")}
        </Button>
      </div>
    </div>
  );
}
