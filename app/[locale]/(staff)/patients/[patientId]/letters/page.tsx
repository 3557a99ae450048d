import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { ResendButton } from "@/components/letters/resend-button";
import { StatusBadge } from "@/components/letters/status-badge";
import { getPatientForMail } from "@/db/queries/mail-context";
import { listPatientMessages } from "@/db/queries/outbox";
import { NO_RECIPIENT } from "@/lib/email/outbox";
import { Link } from "@/lib/i18n/navigation";
import { openRecordPage } from "@/lib/records/patient-record-page";

const kinds = ["gp-summary", "supply-request", "care-team-alert", "digest", "portal-invite", "carer-invite"] as const;

export async function generateMetadata() {
  const t = await getTranslations("Letters");
  return { title: t("title") };
}

export default async function LettersPage({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  // The clinician role, the access check and the audit event before any data is read.
  const { closed } = await openRecordPage({ locale, patientId, action: "patient.view.letters" });
  const [t, format, patient, messages] = await Promise.all([
    getTranslations("Letters"),
    getFormat(),
    getPatientForMail({ patientId }),
    listPatientMessages({ patientId }),
  ]);
  if (!patient) notFound();
  const at = (iso: string | null) => (iso ? format.dateTime(new Date(iso), { dateStyle: "medium", timeStyle: "short" }) : "—");
  const kindLabel = (k: string) => ((kinds as readonly string[]).includes(k) ? t(`kind.${k as (typeof kinds)[number]}`) : t("kind.other"));
  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h2 className="text-2xl font-bold">{t("title")}</h2>
          <p className="text-ink-soft">{t("intro")}</p>
        </div>
        <Link
          href={`/patients/${patientId}/supplies`}
          className="inline-flex min-h-12 items-center rounded-lg border-2 border-brand bg-paper-raised px-5 font-bold text-brand hover:bg-brand-soft"
        >
          {t("suppliesLink")}
        </Link>
      </div>
      {messages.length === 0 ? (
        <p className="rounded-card border border-stone-faint bg-paper-raised p-5">{t("empty")}</p>
      ) : (
        <ul className="flex flex-col gap-4" aria-label={t("listLabel")}>
          {messages.map((m) => (
            <li key={m.id} className="rounded-card border border-stone-faint bg-paper-raised p-5 shadow-sm">
              <div className="flex flex-wrap items-start justify-between gap-3">
                <div className="min-w-0">
                  <p className="text-sm font-bold uppercase tracking-wide text-ink-soft">
                    {kindLabel(m.kind)}
                    {m.resendOfId ? ` · ${t("isResend")}` : ""}
                  </p>
                  <h3 className="text-lg font-bold break-words">{m.subject}</h3>
                </div>
                <StatusBadge status={m.status} label={t(`status.${m.status}`)} />
              </div>
              <dl className="mt-3 grid grid-cols-1 gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
                <dt className="font-bold text-ink-soft">{t("to")}</dt>
                <dd className="break-all">{m.to || t("noAddress")}</dd>
                <dt className="font-bold text-ink-soft">{t("queuedAt")}</dt>
                <dd className="tabular">{at(m.createdAt)}</dd>
                <dt className="font-bold text-ink-soft">{t("sentAt")}</dt>
                <dd className="tabular">{at(m.sentAt)}</dd>
                <dt className="font-bold text-ink-soft">{t("attempts")}</dt>
                <dd className="tabular">{t("attemptsValue", { count: m.attempts })}</dd>
                {m.status === "queued" && m.attempts > 0 ? (
                  <>
                    <dt className="font-bold text-ink-soft">{t("nextTry")}</dt>
                    <dd className="tabular">{at(m.nextAttemptAt)}</dd>
                  </>
                ) : null}
                {m.lastError ? (
                  <>
                    <dt className="font-bold text-ink-soft">{m.status === "sent" ? t("earlierError") : t("lastError")}</dt>
                    <dd className={`break-words ${m.status === "failed" ? "font-bold text-level-emergency-ink" : ""}`}>
                      {m.lastError === NO_RECIPIENT ? t("noRecipient") : m.lastError}
                    </dd>
                  </>
                ) : null}
                {m.attachments.length ? (
                  <>
                    <dt className="font-bold text-ink-soft">{t("attachments")}</dt>
                    <dd className="break-all">{m.attachments.join(", ")}</dd>
                  </>
                ) : null}
              </dl>
              {m.redacted ? (
                <p className="mt-3 text-sm text-ink-soft">{t("redacted")}</p>
              ) : (
                <details className="mt-3">
                  <summary className="cursor-pointer font-bold text-brand underline underline-offset-4">{t("showText")}</summary>
                  <pre dir="auto" className="mt-2 max-h-96 overflow-auto whitespace-pre-wrap rounded-lg bg-paper-sunk p-3 font-sans text-sm">
                    {m.text}
                  </pre>
                </details>
              )}
              {!closed && (m.status === "sent" || m.status === "failed") && !m.redacted && !m.kind.endsWith("-invite") ? (
                <div className="mt-4">
                  <ResendButton patientId={patientId} messageId={m.id} subject={m.subject} />
                </div>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
