import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { Card } from "@/components/ui/card";
import type { DischargeChecklist } from "@/db/schema";
import { DISCHARGE_TEACHING } from "@/lib/clinical";

/** The latest discharge checklist as recorded: every item, those not done said plainly. */
export async function ChecklistSummary({ checklist: c }: { checklist: DischargeChecklist }) {
  const t = await getTranslations("Transfer.checklist");
  const format = await getFormat();
  const day = (d: string) => format.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "medium", timeZone: "UTC" });
  return (
    <Card className="flex flex-col gap-2" data-testid="checklist-summary">
      <p className="text-ink-soft">{t("recordedBy", { name: c.recordedByName, date: format.dateTime(c.createdAt, { dateStyle: "medium", timeStyle: "short" }) })}</p>
      <ul className="flex flex-col gap-1">
        {DISCHARGE_TEACHING.map((item) => (
          <li key={item} className={c.taught.includes(item) ? "" : "font-bold text-level-urgent-ink"}>
            {c.taught.includes(item) ? t("taughtItem", { item: t(`items.${item}`) }) : t("notTaughtItem", { item: t(`items.${item}`) })}
          </li>
        ))}
        <li className={c.suppliesGiven ? "" : "font-bold text-level-urgent-ink"}>{c.suppliesGiven ? t("suppliesFor", { days: c.suppliesDays ?? 0 }) : t("noSupplies")}</li>
        <li className={c.drainage ? "" : "font-bold text-level-urgent-ink"}>{c.drainage ? t(`drainageKind.${c.drainage}`) : t("drainageNotRecorded")}</li>
        <li>{c.plannedTwocOn ? t("twocOn", { date: day(c.plannedTwocOn) }) : t("noTwoc")}</li>
        <li className={c.firstVisitOn ? "" : "font-bold text-level-urgent-ink"}>{c.firstVisitOn ? t("firstVisit", { date: day(c.firstVisitOn) }) : t("noFirstVisit")}</li>
        <li className={c.portalActivationGiven ? "" : "font-bold text-level-urgent-ink"}>{c.portalActivationGiven ? t("portalGiven") : t("portalNotGiven")}</li>
      </ul>
      {c.notes ? <p>{c.notes}</p> : null}
    </Card>
  );
}
