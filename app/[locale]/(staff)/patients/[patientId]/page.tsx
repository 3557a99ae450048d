import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import type { ReactNode } from "react";
import { StateBadge } from "@/components/caseload/state-badge";
import { FindingBadge, type FindingSeverity } from "@/components/patient-record/finding-badge";
import { PatientDetailsPanel } from "@/components/patient-record/patient-details-panel";
import { Card } from "@/components/ui/card";
import { getPatientRecord, listGpPracticeDirectory } from "@/db/queries/patients";
import { charriereToMm, parseIsoDate, stateFor } from "@/lib/clinical";
import { getPlanDefaults, getTwocVoidWindowHours } from "@/lib/config/settings";
import { getLatestEpisode } from "@/db/queries/episodes";
import { TrialPanel } from "@/components/twoc/trial-panel";
import { FollowUpReviewForm } from "@/components/twoc/follow-up-review-form";
import { TwocPlanForm } from "@/components/twoc/twoc-plan-form";
import { trialInProgress } from "@/lib/records/episodes";
import { Link } from "@/lib/i18n/navigation";
import { openRecordPage } from "@/lib/records/patient-record-page";
import { todayIso } from "@/lib/shared/time-zone";
import { isCareTeam } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("PatientRecord.tabs");
  return { title: t("device") };
}

const severities: FindingSeverity[] = ["stop", "warn", "info"];

export default async function DeviceTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  const { via, closed } = await openRecordPage({ locale, patientId, action: "patient.view.device" });
  const [record, gpPractices, planning, latest, windowHours] = await Promise.all([
    getPatientRecord({ patientId }),
    listGpPracticeDirectory(),
    getPlanDefaults(),
    getLatestEpisode({ patientId }),
    getTwocVoidWindowHours(),
  ]);
  if (!record) notFound();
  const t = await getTranslations("PatientDevice");
  const v = await getTranslations("Vocabulary");
  const tVisit = await getTranslations("VisitForm");
  const format = await getFormat();
  const e = record.currentEpisode;
  // The catheter came out for a trial and no outcome is recorded yet.
  const trial = !e ? trialInProgress(latest) : null;
  const today = todayIso();
  const date = (d: string | null | undefined) => (d ? format.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "medium" }) : t("notRecorded"));
  const dateTime = (d: string) => format.dateTime(new Date(d), { dateStyle: "medium", timeStyle: "short" });
  const stateOf = (d: string) => stateFor(parseIsoDate("date", d) - parseIsoDate("today", today), planning.dueSoonDays);
  const daysUntil = (d: string) => parseIsoDate("date", d) - parseIsoDate("today", today);
  const findingText = (code?: string, message?: string) => (code && t.has(`findings.${code}` as "findings.lot-missing") ? t(`findings.${code}` as "findings.lot-missing") : (message ?? code ?? ""));

  const recordHref = (kind: string) => `/patients/${patientId}/record/${kind}`;

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="device-heading" className="flex flex-col gap-4">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2 id="device-heading" className="text-2xl font-bold">
            {e ? t("inPlace") : t("noneInPlace")}
          </h2>
          <div className="flex flex-wrap gap-2">
            {closed ? null : e ? (
              <>
                <ActionLink href={recordHref("change")}>{t("actions.change")}</ActionLink>
                <ActionLink href={recordHref("removal")} secondary>
                  {t("actions.removal")}
                </ActionLink>
                <ActionLink href={recordHref("twoc")} secondary>
                  {t("actions.twoc")}
                </ActionLink>
                <ActionLink href={recordHref("visit")} secondary>
                  {tVisit("action")}
                </ActionLink>
              </>
            ) : (
              <ActionLink href={recordHref("insertion")}>{t("actions.insertion")}</ActionLink>
            )}
          </div>
        </div>

        {e ? (
          <>
            <Card className="flex flex-col gap-4">
              <div className="flex flex-wrap items-baseline gap-x-6 gap-y-1">
                <p className="tabular text-3xl font-bold" data-testid="device-size">
                  {v("device.sizeCh", { ch: e.sizeCh })} <span className="text-lg font-normal text-ink-soft">({t("mm", { mm: format.number(charriereToMm(e.sizeCh), { minimumFractionDigits: 1, maximumFractionDigits: 1 }) })})</span>
                </p>
                <p className="tabular text-2xl font-bold">{t("balloon", { ml: e.balloonMl })}</p>
              </div>
              <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[minmax(12rem,auto)_1fr]">
                <Row label={v("device.route")}>{v(`route.${e.route}`)}</Row>
                <Row label={v("device.type")}>{v(`catheterType.${e.catheterType}`)}</Row>
                <Row label={v("device.material")}>{v(`material.${e.material}`)}</Row>
                <Row label={v("device.length")}>{v(`lengthCategory.${e.lengthCategory}`)}</Row>
                <Row label={v("device.size")}>
                  {v("device.sizeCh", { ch: e.sizeCh })} · {t("mmOuter", { mm: format.number(charriereToMm(e.sizeCh), { minimumFractionDigits: 1, maximumFractionDigits: 1 }) })}
                </Row>
                <Row label={v("device.balloon")}>
                  {t("ml", { ml: e.balloonMl })}
                  {e.makerBalloonMl && e.makerBalloonMl !== e.balloonMl ? ` · ${t("makerBalloon", { ml: e.makerBalloonMl })}` : ""}
                </Row>
                <Row label={v("device.maker")}>{[e.maker, e.productName].filter(Boolean).join(" · ") || t("notRecorded")}</Row>
                <Row label={v("device.lot")}>{e.lot ?? t("notRecorded")}</Row>
                <Row label={v("device.expiry")}>{date(e.expiry)}</Row>
                <Row label={t("fields.gtin")}>{[e.gtin, e.serial ? t("serial", { serial: e.serial }) : null].filter(Boolean).join(" · ") || t("notRecorded")}</Row>
                <Row label={t("fields.udi")}>
                  {e.udi ? <code className="break-all text-sm">{e.udi}</code> : t("notRecorded")}
                </Row>
                <Row label={t("fields.insertedAt")}>{dateTime(e.insertedAt)}</Row>
                <Row label={v("device.insertedBy")}>{e.insertedByName}</Row>
                <Row label={v("device.indication")}>{e.indication}</Row>
                <Row label={t("fields.gel")}>
                  {v(`gelKind.${e.gelKind}`)}
                  {e.gelVolumeMl !== null && e.gelVolumeMl !== undefined && e.gelKind !== "none" ? ` · ${t("ml", { ml: e.gelVolumeMl })}` : ""}
                </Row>
                <Row label={t("fields.residual")}>{e.residualUrineMl === null ? t("notRecorded") : t("ml", { ml: e.residualUrineMl })}</Row>
                <Row label={t("fields.urine")}>
                  {[e.urineDescription, e.specimenTaken ? t("specimenTaken") : null].filter(Boolean).join(" · ") || t("notRecorded")}
                </Row>
                <Row label={t("fields.attempts")}>{t("attempts", { count: e.attempts })}</Row>
                <Row label={t("fields.difficulties")}>{e.difficulties || t("none")}</Row>
                <Row label={t("fields.reaction")}>{e.patientReaction || t("notRecorded")}</Row>
                {e.largerSizeReason ? <Row label={t("fields.largerSize")}>{e.largerSizeReason}</Row> : null}
                <Row label={t("fields.maxDwell")}>{e.maxDwellDays ? t("days", { count: e.maxDwellDays }) : t("notRecorded")}</Row>
                {e.awaitingTwoc ? <Row label={t("fields.twoc")}>{t("awaitingTwoc")}</Row> : null}
              </dl>
            </Card>

            <Card className="flex flex-col gap-3" data-testid="planned-dates">
              <h3 className="text-xl font-bold">{t("plannedTitle")}</h3>
              <ul className="flex flex-col gap-3">
                {([
                  ["change", e.plannedChangeOn],
                  ["review", e.reviewDueOn],
                ] as const).map(([kind, d]) => (
                  <li key={kind} className="flex flex-wrap items-center gap-x-4 gap-y-1">
                    <span className="min-w-48 font-bold">{t(`planned.${kind}`)}</span>
                    <span className="tabular text-lg">{date(d)}</span>
                    <span className="tabular text-ink-soft">
                      {daysUntil(d) === 0 ? t("dueToday") : daysUntil(d) > 0 ? t("inDays", { count: daysUntil(d) }) : t("daysAgo", { count: -daysUntil(d) })}
                    </span>
                    <StateBadge state={stateOf(d)} />
                  </li>
                ))}
              </ul>
              <p className="text-sm text-ink-soft">{t("safety")}</p>
            </Card>

            <Card className="flex flex-col gap-3">
              <h3 className="text-xl font-bold">{t("findingsTitle")}</h3>
              {e.findings.length === 0 ? (
                <p>{t("noFindings")}</p>
              ) : (
                <ul className="flex flex-col gap-2">
                  {e.findings.map((f, i) => (
                    <li key={`${f.code}-${i}`} className="flex flex-wrap items-start gap-2">
                      <FindingBadge severity={severities.includes(f.severity as FindingSeverity) ? (f.severity as FindingSeverity) : "info"} />
                      <span>{findingText(f.code, f.message)}</span>
                    </li>
                  ))}
                </ul>
              )}
              {e.overrides.length ? (
                <div className="flex flex-col gap-2">
                  <h4 className="font-bold">{t("overridesTitle")}</h4>
                  <ul className="flex flex-col gap-2">
                    {e.overrides.map((o, i) => (
                      <li key={`${o.code}-${i}`} className="rounded-lg border-2 border-finding-stop bg-finding-stop-soft p-3">
                        <p className="font-bold">{findingText(o.code)}</p>
                        <p>{t("overrideReason", { reason: o.reason })}</p>
                      </li>
                    ))}
                  </ul>
                </div>
              ) : null}
              <p className="text-sm text-ink-soft">{t("safety")}</p>
            </Card>
            {closed ? null : (
              <Card>
                <TwocPlanForm patientId={patientId} plannedOn={e.twocPlannedOn ?? null} medicineNote={e.twocMedicineNote ?? null} />
              </Card>
            )}
          </>
        ) : trial ? (
          <TrialPanel patientId={patientId} removedAt={trial.removedAt!.toISOString()} windowHours={windowHours} closed={closed} />
        ) : (
          <>
          <Card>
            {record.patient.catheterDischargedAt ? (
              <p className="font-bold" data-testid="catheter-discharged">
                {record.patient.followUpReviewOn
                  ? t("discharged", { date: dateTime(record.patient.catheterDischargedAt), review: date(record.patient.followUpReviewOn) })
                  : t("dischargedFollowUpEnded", { date: dateTime(record.patient.catheterDischargedAt) })}
              </p>
            ) : null}
            <p>{t("noneInPlaceBody")}</p>
          </Card>
          {record.patient.catheterDischargedAt && record.patient.followUpReviewOn && !closed ? (
            <Card>
              <FollowUpReviewForm patientId={patientId} />
            </Card>
          ) : null}
          </>
        )}
      </section>

      <section aria-labelledby="details-heading" className="flex flex-col gap-3">
        <h2 id="details-heading" className="text-2xl font-bold">
          {t("detailsTitle")}
        </h2>
        <Card>
          <PatientDetailsPanel patient={record.patient} gpPractices={gpPractices} canEdit={isCareTeam(via) && !closed} />
        </Card>
      </section>
    </div>
  );
}

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="contents">
      <dt className="font-bold text-ink-soft">{label}</dt>
      <dd className="tabular">{children}</dd>
    </div>
  );
}

function ActionLink({ href, secondary, children }: { href: string; secondary?: boolean; children: ReactNode }) {
  return (
    <Link
      href={href}
      className={`inline-flex min-h-12 items-center rounded-lg px-4 font-bold ${
        secondary ? "border-2 border-brand bg-paper-raised text-brand hover:bg-brand-soft" : "bg-brand text-white hover:bg-brand-strong"
      }`}
    >
      {children}
    </Link>
  );
}
