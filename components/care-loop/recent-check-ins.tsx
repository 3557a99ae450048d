// The patient's and carer's side of the loop: their latest check-ins and, for each that went to
// the care team, "Your care team saw this at 10:42" or that it is waiting. An emergency still says
// to call the emergency number now: Caddis is not an emergency service.
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { LevelBadge } from "@/components/portal/level-badge";
import { Card } from "@/components/ui/card";
import { listCheckInsWithAcknowledgement } from "@/db/queries/caseload-items";
import { getEmergencyNumber } from "@/lib/config/settings";
import { Link } from "@/lib/i18n/navigation";
import { dayIn } from "@/lib/shared/time-zone";

/** `carerOf`: the patient's first name when a carer reads it ("Arthur's recent check-ins"). */
export async function RecentCheckIns({ patientId, carerOf = null }: { patientId: string; carerOf?: string | null }) {
  const [rows, emergencyNumber] = await Promise.all([listCheckInsWithAcknowledgement({ patientId }), getEmergencyNumber()]);
  if (rows.length === 0) return null;
  const t = await getTranslations("CareLoopPortal");
  const format = await getFormat();
  const when = (d: Date) =>
    dayIn(d) === dayIn(new Date())
      ? format.dateTime(d, { hour: "2-digit", minute: "2-digit", hourCycle: "h23" })
      : format.dateTime(d, { weekday: "long", day: "numeric", month: "long", hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  return (
    <Card className="flex flex-col gap-3" data-testid="recent-check-ins">
      <h2 className="text-xl font-bold">{carerOf ? (await getTranslations("PortalReach.carers"))("carerRecent", { name: carerOf }) : t("title")}</h2>
      <ul className="flex flex-col gap-4">
        {rows.map((r) => (
          <li key={r.id} className="flex flex-col gap-1" data-testid="recent-check-in" data-level={r.level}>
            <LevelBadge level={r.level} size="small" />
            <p className="tabular">{t("answered", { when: when(r.at) })}</p>
            {r.alerted && r.seenAt ? (
              <p className="text-lg font-bold" data-testid="care-team-saw">
                {t("seen", { when: when(r.seenAt) })}
              </p>
            ) : null}
            {r.alerted && !r.seenAt ? <p data-testid="care-team-told">{t("told")}</p> : null}
            {r.alerted && !r.seenAt && r.level === "emergency" ? (
              <p className="font-bold text-level-emergency-ink">
                {emergencyNumber ? t("stillCall", { number: emergencyNumber }) : t("stillCallUnset")}
              </p>
            ) : null}
          </li>
        ))}
      </ul>
      <Link href={{ pathname: "/more/check-ins", query: { patient: patientId } }} className="inline-flex min-h-11 items-center font-bold text-brand underline" data-testid="history-link">
        {(await getTranslations("PortalReach.history"))("seeAll")}
      </Link>
    </Card>
  );
}
