import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { Card } from "@/components/ui/card";
import { News2Panel } from "@/components/visit-form/news2-panel";
import { FindingsSummary } from "@/components/visit-form/findings-summary";
import { getPatientHistory, type HistoryEpisode, type HistoryEvent } from "@/db/queries/history";
import { listObservations } from "@/db/queries/observations";
import { ObservationTable } from "@/components/observation-trends/observation-table";
import { ObservationTrends } from "@/components/observation-trends/observation-trends";
import { openRecordPage } from "@/lib/records/patient-record-page";
import { twocResult, twocResultLines } from "@/lib/shared/twoc-result";

export async function generateMetadata() {
  const t = await getTranslations("PatientRecord.tabs");
  return { title: t("history") };
}

export default async function HistoryTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  await openRecordPage({ locale, patientId, action: "patient.view.history" });
  const [history, observations] = await Promise.all([getPatientHistory({ patientId }), listObservations({ patientId, limit: 30 })]);
  const tv = await getTranslations("Visits.trends");
  const t = await getTranslations("PatientHistory");
  const vocab = await getTranslations("Vocabulary");
  const tw = await getTranslations("Twoc.result");
  const tf = await getTranslations("Twoc.followUp");
  const format = await getFormat();
  const dateTime = (iso: string) => format.dateTime(new Date(iso), { dateStyle: "medium", timeStyle: "short" });
  const date = (iso: string) => format.dateTime(new Date(`${iso}T12:00:00Z`), { dateStyle: "medium" });
  const b = history.blockage;

  const eventLine = (v: HistoryEvent) => {
    const parts = [v.kind === "review" && v.details.followUp ? tf("historyLabel") : vocab(`eventKind.${v.kind}`)];
    if (v.reason) parts.push(vocab(`unplannedReason.${v.reason}`));
    if (v.twocOutcome) parts.push(vocab(`twocOutcome.${v.twocOutcome}`));
    return parts.join(" — ");
  };

  const total = history.episodes.length;
  return (
    <div className="flex flex-col gap-6">
      <Card className="flex flex-col gap-2" data-testid="blockage-pattern">
        <h2 className="text-xl font-bold">{t("blockageTitle")}</h2>
        {b.status === "pattern" ? (
          <>
            <p className="text-lg">
              {t("blockageFound", { count: b.blockageEpisodes, typical: format.number(b.typicalDwellDays), shortest: b.shortestDwellDays, longest: b.longestDwellDays })}
            </p>
            <p className="text-xl font-bold text-brand" data-testid="blockage-suggestion">
              {t("blockageSuggestion", { days: b.suggestedIntervalDays })}
            </p>
            {b.atFloor ? <p className="font-bold text-level-urgent-ink">{t("blockageAtFloor", { days: b.suggestedIntervalDays })}</p> : null}
            <p className="text-sm text-ink-soft">{t("blockageBasis")}</p>
          </>
        ) : (
          <p>{t("blockageInsufficient", { count: b.blockageEpisodes, needed: b.needed })}</p>
        )}
        <p className="text-sm font-bold text-ink-soft">{t("safety")}</p>
      </Card>

      {observations.length ? (
        <section aria-labelledby="trends-heading" className="flex flex-col gap-3" data-testid="observation-trends">
          <h2 id="trends-heading" className="text-2xl font-bold">
            {tv("title")}
          </h2>
          <p className="text-sm text-ink-soft">{tv("bandsKey")}</p>
          <ObservationTrends
            points={[...observations].reverse().map((o) => ({
              takenAt: o.takenAt,
              respirationRate: o.values.respirationRate,
              spo2: o.values.spo2,
              systolicBp: o.values.systolicBp,
              pulse: o.values.pulse,
              temperatureC: o.values.temperatureC,
              total: o.news2.total,
            }))}
          />
          <ObservationTable observations={observations} />
        </section>
      ) : null}

      <section aria-labelledby="timeline-heading" className="flex flex-col gap-3">
        <h2 id="timeline-heading" className="text-2xl font-bold">
          {t("timelineTitle")}
        </h2>
        {total === 0 ? (
          <p>{t("empty")}</p>
        ) : (
          <ol className="flex flex-col gap-4 border-s-4 border-brand-soft ps-4" data-testid="history-timeline">
            {history.episodes.map((e, i) => (
              <EpisodeItem
                key={e.id}
                e={e}
                number={total - i}
                labels={{
                  heading: t("episodeHeading", { number: total - i, route: vocab(`route.${e.route}`), size: e.sizeCh }),
                  device: t("episodeDevice", { material: vocab(`material.${e.material}`), balloon: e.balloonMl }),
                  inserted: t("inserted", { when: dateTime(e.insertedAt), who: e.insertedByName }),
                  organisation: e.organisationName ? t("atOrganisation", { organisation: e.organisationName }) : null,
                  dwell: e.inPlace ? t("dwellInPlace", { count: e.dwellDays }) : t("dwellRemoved", { count: e.dwellDays }),
                  status: e.inPlace
                    ? t("inPlace", { change: date(e.plannedChangeOn), review: date(e.reviewDueOn) })
                    : t("removed", { when: dateTime(e.removedAt!), reason: t(`endReasons.${e.endReason ?? "other"}`) }),
                  lotMaker: [e.maker, e.lot ? t("lot", { lot: e.lot }) : null].filter(Boolean).join(" · "),
                  indication: t("indication", { indication: e.indication }),
                  awaitingTwoc: e.awaitingTwoc ? t("awaitingTwoc") : null,
                  eventsTitle: t("eventsTitle"),
                  overridesTitle: t("overridesTitle"),
                  overrideLine: (code: string, reason: string) => t("overrideLine", { code, reason }),
                  event: (v: HistoryEvent) => ({
                    what: eventLine(v),
                    who: t("byWhen", { who: v.recordedByName, when: dateTime(v.occurredAt) }),
                    where: v.organisationName,
                    // The trial's voids, residual and what was done, as the GP summary gives them.
                    result:
                      v.kind === "twoc_outcome"
                        ? twocResultLines(
                            twocResult(v.details),
                            (key, values) => tw(key, values as never),
                            (a) => vocab(`failedAction.${a}`),
                            (s) => vocab(`twocSymptom.${s}`),
                          ).join(" · ")
                        : v.kind === "review" && v.details.followUp
                          ? typeof v.details.nextReviewOn === "string"
                            ? tf("historyNext", { date: date(v.details.nextReviewOn) })
                            : tf("historyEnded")
                          : null,
                  }),
                }}
              />
            ))}
          </ol>
        )}
      </section>
    </div>
  );
}

type Labels = {
  heading: string;
  device: string;
  inserted: string;
  organisation: string | null;
  dwell: string;
  status: string;
  lotMaker: string;
  indication: string;
  awaitingTwoc: string | null;
  eventsTitle: string;
  overridesTitle: string;
  overrideLine: (code: string, reason: string) => string;
  event: (v: HistoryEvent) => { what: string; who: string; where: string | null; result: string | null };
};

function EpisodeItem({ e, labels }: { e: HistoryEpisode; number: number; labels: Labels }) {
  return (
    <li className="relative">
      <span aria-hidden="true" className={`absolute -start-[1.65rem] top-2 h-4 w-4 rounded-full border-4 ${e.inPlace ? "border-brand bg-paper-raised" : "border-stone bg-stone"}`} />
      <Card className="flex flex-col gap-2">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h3 className="text-lg font-bold">{labels.heading}</h3>
          <span className={`tabular rounded-full px-3 py-0.5 font-bold ${e.inPlace ? "bg-brand text-white" : "bg-paper-sunk"}`}>{labels.dwell}</span>
        </div>
        <p className="tabular">{labels.device}</p>
        <p className="tabular">
          {labels.inserted}
          {labels.organisation ? ` · ${labels.organisation}` : ""}
        </p>
        <p className={`tabular ${!e.inPlace && e.endReason && e.endReason !== "planned" ? "font-bold" : ""}`}>{labels.status}</p>
        {labels.lotMaker ? <p className="text-sm text-ink-soft">{labels.lotMaker}</p> : null}
        <p className="text-sm text-ink-soft">{labels.indication}</p>
        {labels.awaitingTwoc ? <p className="font-bold text-level-soon-ink">{labels.awaitingTwoc}</p> : null}
        {e.events.length ? (
          <div>
            <h4 className="font-bold">{labels.eventsTitle}</h4>
            <ul className="flex flex-col gap-1">
              {e.events.map((v) => {
                const line = labels.event(v);
                return (
                  <li key={v.id} className="tabular">
                    <span className="font-bold">{line.what}</span> · {line.who}
                    {line.where ? ` · ${line.where}` : ""}
                    {v.kind === "visit" && v.details.findings ? <FindingsSummary findings={v.details.findings} /> : null}
                    {line.result ? (
                      <p className="tabular" data-testid="twoc-result">
                        {line.result}
                      </p>
                    ) : null}
                    {v.notes ? <p className="text-sm text-ink-soft">{v.notes}</p> : null}
                    {v.observation ? (
                      <div className="mt-2">
                        <News2Panel score={v.observation.news2} values={v.observation.values} testId="history-news2" showResponse={false} />
                      </div>
                    ) : null}
                  </li>
                );
              })}
            </ul>
          </div>
        ) : null}
        {e.overrides.length ? (
          <div className="rounded-lg border-2 border-finding-stop bg-finding-stop-soft p-3">
            <h4 className="font-bold">{labels.overridesTitle}</h4>
            <ul>
              {e.overrides.map((o, i) => (
                <li key={`${o.code}-${i}`}>{labels.overrideLine(o.code, o.reason)}</li>
              ))}
            </ul>
          </div>
        ) : null}
      </Card>
    </li>
  );
}
