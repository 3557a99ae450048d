import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { StatusBadge } from "@/components/letters/status-badge";
import { SupplyRequestForm } from "@/components/supplies/supply-request-form";
import { getSupplyContext, listSupplyRequests } from "@/db/queries/supply-requests";
import { getLatestDischargeChecklist } from "@/db/queries/referrals";
import { Link } from "@/lib/i18n/navigation";
import { todayIso } from "@/lib/shared/time-zone";
import { DEFAULT_SUPPLY_PERIOD, supplyPeriodChoices } from "@/lib/validations/supply-request";
import { openRecordPage } from "@/lib/records/patient-record-page";

export async function generateMetadata() {
  const t = await getTranslations("Supplies");
  return { title: t("title") };
}

/**
 * Starting values from the discharge checklist: a valve instead of a leg bag, and before a
 * planned trial without catheter only the period up to it (the longest choice that fits).
 */
function dischargeDefaults(c: Awaited<ReturnType<typeof getLatestDischargeChecklist>>) {
  const today = Date.parse(`${todayIso()}T00:00:00Z`);
  const untilTwoc = c?.plannedTwocOn ? Math.round((Date.parse(`${c.plannedTwocOn}T00:00:00Z`) - today) / 86_400_000) : null;
  const period =
    untilTwoc !== null && untilTwoc >= 0 ? ([...supplyPeriodChoices].reverse().find((d) => d <= untilTwoc) ?? supplyPeriodChoices[0]) : DEFAULT_SUPPLY_PERIOD;
  return { initialPeriod: period, valve: c?.drainage === "valve" };
}

const items = ["catheter", "leg-bag", "night-bag", "valve", "gel"] as const;

export default async function SuppliesPage({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  // The clinician role, the access check and the audit event before any data is read.
  const { closed } = await openRecordPage({ locale, patientId, action: "patient.view.supplies" });
  const [t, v, tl, tr, format, ctx, history] = await Promise.all([
    getTranslations("Supplies"),
    getTranslations("Vocabulary"),
    getTranslations("Letters"),
    getTranslations("PatientRecord"),
    getFormat(),
    getSupplyContext({ patientId }),
    listSupplyRequests({ patientId }),
  ]);
  const checklist = await getLatestDischargeChecklist({ patientId });
  if (!ctx) notFound();
  const at = (iso: string) => format.dateTime(new Date(iso), { dateStyle: "medium", timeStyle: "short" });
  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h2 className="text-2xl font-bold">{t("title")}</h2>
          <p className="text-ink-soft">{t("intro", { gp: ctx.gp?.name ?? t("noGpName") })}</p>
        </div>
        <Link
          href={`/patients/${patientId}/letters`}
          className="inline-flex min-h-12 items-center rounded-lg border-2 border-brand bg-paper-raised px-5 font-bold text-brand hover:bg-brand-soft"
        >
          {t("lettersLink")}
        </Link>
      </div>
      <section aria-labelledby="new-request" className="rounded-card border border-stone-faint bg-paper-raised p-5 shadow-sm">
        <h3 id="new-request" className="mb-1 text-xl font-bold">
          {t("newRequest")}
        </h3>
        {closed ? (
          <p>{tr("closedNoWrites")}</p>
        ) : ctx.episode && ctx.changeIntervalDays ? (
          <>
            <p className="mb-4 text-ink-soft">
              {t("device", { ch: ctx.episode.sizeCh, ml: ctx.episode.balloonMl, days: ctx.changeIntervalDays })}
            </p>
            {ctx.plannedIntervalDays && ctx.changeIntervalDays < ctx.plannedIntervalDays ? (
              <p className="mb-4 font-bold" data-testid="supplies-blockage">
                {t("blockageInterval", { days: ctx.changeIntervalDays, planned: ctx.plannedIntervalDays })}
              </p>
            ) : null}
            {ctx.firstChangeInDays !== null ? <p className="mb-4 text-ink-soft">{t("nextChange", { days: ctx.firstChangeInDays })}</p> : null}
            {ctx.episode.twocPlannedOn ? (
              <p className="mb-4 rounded-lg border-2 border-finding-info bg-finding-info-soft p-3" data-testid="supplies-after-trial">
                {t("afterTrial", { date: format.dateTime(new Date(`${ctx.episode.twocPlannedOn}T12:00:00Z`), { dateStyle: "medium" }) })}
              </p>
            ) : null}
            <SupplyRequestForm
              patientId={patientId}
              changeIntervalDays={ctx.changeIntervalDays}
              firstChangeInDays={ctx.firstChangeInDays ?? undefined}
              spareCatheters={ctx.spareCatheters}
              gelName={ctx.episode.gelKind !== "none" ? v(`gelKind.${ctx.episode.gelKind}`) : null}
              gpName={ctx.gp?.name ?? null}
              gpHasInbox={Boolean(ctx.gp?.inboxEmail)}
              {...dischargeDefaults(checklist)}
            />
          </>
        ) : (
          <p>{t("noCatheter")}</p>
        )}
      </section>
      <section aria-labelledby="history">
        <h3 id="history" className="mb-3 text-xl font-bold">
          {t("history")}
        </h3>
        {history.length === 0 ? (
          <p>{t("historyEmpty")}</p>
        ) : (
          <ul className="flex flex-col gap-3">
            {history.map((r) => (
              <li key={r.id} className="rounded-card border border-stone-faint bg-paper-raised p-4">
                <div className="flex flex-wrap items-center justify-between gap-3">
                  <p className="font-bold">{t("historyItem", { days: r.periodDays, name: r.requestedByName, date: at(r.createdAt) })}</p>
                  {r.message ? <StatusBadge status={r.message.status as "sent"} label={tl(`status.${r.message.status as "sent"}`)} /> : null}
                </div>
                <ul className="mt-2 flex flex-wrap gap-x-6 gap-y-1 text-sm">
                  {r.items.map((i) => (
                    <li key={i.item} className="tabular">
                      {t("historyLine", {
                        item: (items as readonly string[]).includes(i.item) ? v(`supplyItem.${i.item as (typeof items)[number]}`) : i.item,
                        quantity: i.quantity,
                        computed: i.computed,
                      })}
                    </li>
                  ))}
                </ul>
                {r.note ? <p className="mt-2 text-sm">{r.note}</p> : null}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
