"use client";
// Issuing the passport. The QR and the passport code come back once, in the answer to the
// issue request; this component holds them only in memory and never stores them.
import { useMutation } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useEffect, useRef, useState, useTransition, type ReactNode } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch, isApiError } from "@/lib/browser/api-client";
import type { PassportOverview } from "@/lib/shared/dto";
import { useRouter } from "@/lib/i18n/navigation";
import { localeNames, type Locale } from "@/lib/i18n/routing";
import { TableHead } from "@/components/ui/table-head";

type Issued = {
  passport: { id: string; issuedAt: string; issuedByName: string | null; languages: string[] };
  url: string;
  shortCode: string;
  qrSvg: string;
  pdfUrl: string;
  gpSummaryQueued: boolean;
  activation: { code: string; expiresAt: string; activateUrl: string; pdfBase64: string } | null;
};

function issue(patientId: string, reissue: boolean, activationCode: boolean): Promise<Issued> {
  return apiFetch<Issued>(`/api/patients/${patientId}/passport`, {
    method: "POST",
    body: { ...(reissue ? { reissue: true } : {}), ...(activationCode ? { activationCode: true } : {}) },
  });
}

/** The one-time booklet (with the activation code) as a download link held in memory only. */
function pdfObjectUrl(base64: string): string {
  const bytes = Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
  return URL.createObjectURL(new Blob([bytes], { type: "application/pdf" }));
}

function svgDataUrl(svg: string) {
  // The SVG comes from our own server (lib/qr) and holds only ASCII path data.
  return `data:image/svg+xml;base64,${btoa(svg)}`;
}

export function PassportPanel({
  patientId,
  overview,
  languages,
  hasDevice,
  canOfferActivation,
  readOnly = false,
  translationStatus = null,
}: {
  patientId: string;
  overview: PassportOverview;
  languages: string[];
  hasDevice: boolean;
  /** No portal account yet and the viewer is in the care team: offer a code on the booklet. */
  canOfferActivation: boolean;
  /** A closed record: its passport history is shown, nothing can be issued. */
  readOnly?: boolean;
  /** Whether each translated language's texts were reviewed (rendered on the server). */
  translationStatus?: ReactNode;
}) {
  const t = useTranslations("Passport");
  const tc = useTranslations("Common");
  const tRecord = useTranslations("PatientRecord");
  const format = useFormat();
  const router = useRouter();
  const [issued, setIssued] = useState<Issued | null>(null);
  const [confirming, setConfirming] = useState(false);
  const [withCode, setWithCode] = useState(false);
  const [codePdfUrl, setCodePdfUrl] = useState<string | null>(null);
  // The current passport and the history come from the server: refreshed after an issue.
  const [refreshing, startRefresh] = useTransition();
  const confirmRef = useRef<HTMLButtonElement>(null);
  const issuedRef = useRef<HTMLHeadingElement>(null);
  const mutation = useMutation({
    mutationFn: (reissue: boolean) => issue(patientId, reissue, canOfferActivation && withCode),
    onSuccess: (result) => {
      setIssued(result);
      setCodePdfUrl(result.activation ? pdfObjectUrl(result.activation.pdfBase64) : null);
      setConfirming(false);
      setWithCode(false);
      startRefresh(() => router.refresh());
    },
  });
  // The dialog takes focus when it opens; the new passport when it arrives.
  useEffect(() => {
    if (confirming) confirmRef.current?.focus();
  }, [confirming]);
  useEffect(() => {
    if (issued) issuedRef.current?.focus();
  }, [issued]);
  useEffect(() => () => {
    if (codePdfUrl) URL.revokeObjectURL(codePdfUrl);
  }, [codePdfUrl]);
  const failedFields = isApiError(mutation.error) ? mutation.error.fields : {};
  const activationChoice = canOfferActivation ? (
    <label className="flex max-w-prose items-start gap-3">
      <input
        type="checkbox"
        checked={withCode}
        onChange={(e) => setWithCode(e.target.checked)}
        className="mt-1 h-6 w-6 shrink-0 accent-brand"
        data-testid="passport-activation-choice"
      />
      <span>
        <span className="font-bold">{t("activationOffer")}</span>
        <span className="block text-ink-soft">{t("activationHint")}</span>
      </span>
    </label>
  ) : null;
  const current = overview.current;
  const when = (iso: string) => format.dateTime(new Date(iso), { dateStyle: "medium", timeStyle: "short" });
  const languageNames = (codes: string[]) => codes.map((c) => localeNames[c as Locale] ?? c).join(" + ");
  const pdfUrl = `/api/patients/${patientId}/passport/pdf`;

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="passport-heading" className="flex flex-col gap-3">
        <h2 id="passport-heading" className="text-2xl font-bold">
          {t("title")}
        </h2>
        <p className="max-w-prose">{t("intro")}</p>
        <p>
          <span className="font-bold">{t("languages")}:</span> {languageNames(languages)}
        </p>
        {readOnly ? (
          <p className="rounded-lg border-2 border-stone-line bg-paper-sunk p-3 font-bold">{tRecord("closedNoWrites")}</p>
        ) : !hasDevice ? (
          <p className="rounded-lg border-2 border-stone-line bg-paper-sunk p-3">{t("noDevice")}</p>
        ) : null}
        <p className="max-w-prose rounded-lg border border-stone-faint bg-paper-sunk p-3" data-testid="passport-safety">
          {t("safety")}
        </p>
      </section>

      {issued ? (
        <Card className="flex flex-col gap-4 border-2 border-brand" data-testid="passport-issued">
          <h3 ref={issuedRef} tabIndex={-1} className="text-xl font-bold">
            {t("issuedTitle")}
          </h3>
          <p role="status" className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink">
            {t("showOnce")}
          </p>
          <div className="flex flex-col items-start gap-6 sm:flex-row">
            {/* eslint-disable-next-line @next/next/no-img-element */}
            <img
              src={svgDataUrl(issued.qrSvg)}
              alt={t("qrAlt")}
              width={240}
              height={240}
              className="h-60 w-60 rounded-lg border border-stone-faint bg-white p-2"
              data-testid="passport-qr"
            />
            <div className="flex flex-col gap-3">
              <div>
                <p className="font-bold">{t("code")}</p>
                <p className="tabular text-3xl font-bold tracking-wider" dir="ltr" data-testid="passport-code">
                  {issued.shortCode}
                </p>
                <p className="text-sm text-ink-soft">{t("codeHint")}</p>
              </div>
              <div>
                <p className="font-bold">{t("link")}</p>
                <p className="break-all font-mono text-sm" dir="ltr" data-testid="passport-url">
                  {issued.url}
                </p>
              </div>
              {issued.activation && codePdfUrl ? (
                <div className="flex flex-col gap-2 rounded-lg border-2 border-brand bg-brand-soft p-3" data-testid="passport-activation">
                  <p className="font-bold">{t("activationTitle")}</p>
                  <p className="tabular text-2xl font-bold tracking-wider" dir="ltr" data-testid="passport-activation-code">
                    {issued.activation.code}
                  </p>
                  <p>{t("activationExpires", { date: format.dateTime(new Date(issued.activation.expiresAt), { dateStyle: "long" }) })}</p>
                  <a
                    href={codePdfUrl}
                    download={`caddis-passport-${issued.passport.issuedAt.slice(0, 10)}-portal.pdf`}
                    className={buttonClass("primary")}
                    data-testid="passport-download-with-code"
                  >
                    {t("downloadWithCode")}
                  </a>
                  <p className="text-sm">{t("activationNotStored")}</p>
                </div>
              ) : null}
              <a
                href={pdfUrl}
                download
                className={buttonClass(issued.activation ? "secondary" : "primary")}
                data-testid="passport-download"
              >
                {issued.activation ? t("downloadWithoutCode") : t("download")}
              </a>
            </div>
          </div>
          {issued.gpSummaryQueued ? (
            <p role="status" data-testid="passport-gp-queued">
              {t("gpQueued")}
            </p>
          ) : null}
        </Card>
      ) : null}

      <Card className={`flex flex-col gap-4 ${refreshing ? "opacity-60" : ""}`} aria-busy={refreshing || undefined} data-testid="passport-current">
        <h3 className="text-xl font-bold">{t("current")}</h3>
        {current ? (
          <>
            <dl className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
              <dt className="font-bold">{t("issuedOn")}</dt>
              <dd className="tabular">{when(current.issuedAt)}</dd>
              <dt className="font-bold">{t("issuedBy")}</dt>
              <dd>{current.issuedByName ?? "—"}</dd>
              <dt className="font-bold">{t("languages")}</dt>
              <dd>{languageNames(current.languages)}</dd>
            </dl>
            {current.outOfDate && !issued ? (
              <p role="note" className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink" data-testid="passport-out-of-date">
                {t("outOfDate")}
              </p>
            ) : null}
            {!issued ? <p className="text-ink-soft">{t("qrHidden")}</p> : null}
            <div className="flex flex-wrap gap-3">
              {!issued ? (
                <a href={pdfUrl} download className={buttonClass("secondary")}>
                  {t("download")}
                </a>
              ) : null}
              {readOnly ? null : <Button
                variant={issued ? "secondary" : "primary"}
                onClick={() => setConfirming(true)}
                disabled={mutation.isPending || confirming}
                data-testid="passport-reissue"
              >
                {t("reissue")}
              </Button>}
            </div>
            {readOnly ? null : <p className="text-sm text-ink-soft">{t("reissueHint")}</p>}
          </>
        ) : (
          <>
            <p>{t("none")}</p>
            {readOnly ? null : <>{activationChoice}
            <div>
              <Button onClick={() => mutation.mutate(false)} disabled={mutation.isPending} data-testid="passport-issue">
                {mutation.isPending ? t("issuing") : t("issue")}
              </Button>
            </div></>}
          </>
        )}
        {confirming ? (
          <div role="alertdialog" aria-labelledby="reissue-title" aria-describedby="reissue-body" className="flex flex-col gap-3 rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-4">
            <p id="reissue-title" className="text-lg font-bold text-level-urgent-ink">
              {t("confirmTitle")}
            </p>
            <p id="reissue-body">{t("confirmBody")}</p>
            {activationChoice}
            <div className="flex flex-wrap gap-3">
              <button
                type="button"
                ref={confirmRef}
                className={buttonClass("danger")}
                onClick={() => mutation.mutate(true)}
                disabled={mutation.isPending}
                data-testid="passport-reissue-confirm"
              >
                {mutation.isPending ? t("issuing") : t("confirm")}
              </button>
              <Button variant="secondary" onClick={() => setConfirming(false)} disabled={mutation.isPending}>
                {tc("cancel")}
              </Button>
            </div>
          </div>
        ) : null}
        {mutation.isError ? (
          <ErrorAlert
            message={failedFields.emergencyNumber ? t("errorEmergency") : failedFields.activationCode ? t("errorHasAccount") : t("error")}
            testId="passport-error"
          />
        ) : null}
      </Card>

      {overview.history.length > 0 ? (
        <section aria-labelledby="passport-history" className="flex flex-col gap-3">
          <h3 id="passport-history" className="text-xl font-bold">
            {t("history")}
          </h3>
          <div className="overflow-x-auto rounded-card border border-stone-faint bg-paper-raised">
            <table className="w-full text-start">
              <TableHead columns={[t("issuedOn"), t("issuedBy"), t("languages"), t("status")]} />
              <tbody>
                {overview.history.map((p) => (
                  <tr key={p.id} className="border-t border-stone-faint">
                    <td className="tabular p-3">{when(p.issuedAt)}</td>
                    <td className="p-3">{p.issuedByName ?? "—"}</td>
                    <td className="p-3">{languageNames(p.languages)}</td>
                    <td className="p-3">
                      {p.revokedAt ? (
                        <span>
                          {t("statusRevoked")} · <span className="tabular">{when(p.revokedAt)}</span>
                        </span>
                      ) : (
                        <span className="font-bold text-level-selfcare-ink">{t("statusCurrent")}</span>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ) : null}

      {translationStatus}
    </div>
  );
}
