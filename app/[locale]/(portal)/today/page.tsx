import { getTranslations } from "next-intl/server";
import { WithTerms } from "@/components/glossary/glossary-term";
import { glossaryEntries } from "@/components/glossary/with-terms";
import { getFormat } from "@/lib/i18n/format";
import { DueWords } from "@/components/portal/due-words";
import { LevelBadge } from "@/components/portal/level-badge";
import { PatientSwitcher } from "@/components/portal/patient-switcher";
import { BagChangeButtons } from "@/components/today/bag-change-buttons";
import { RecentCheckIns } from "@/components/care-loop/recent-check-ins";
import { Card } from "@/components/ui/card";
import { getLastBagChanges } from "@/db/queries/bag-changes";
import { listRemovedCarerLinks } from "@/db/queries/invitations";
import { getTodaySummary } from "@/db/queries/portal";
import { getHelpContacts } from "@/db/queries/contacts";
import { getLastRemoval } from "@/db/queries/episodes";
import { AfterCatheter } from "@/components/twoc/after-catheter";
import { requirePageRole } from "@/lib/auth/permissions";
import { LEVEL_STEP_KEY } from "@/lib/shared/check-in-flow";
import { BAG_INTERVALS, bagSchedule, parseIsoDate } from "@/lib/clinical";
import { Link } from "@/lib/i18n/navigation";
import { todayIso } from "@/lib/shared/time-zone";
import { portalPatient, portalPatients, subjectName } from "@/lib/portal";

/** How long the last check-in's instruction ("call now") still reads as today's (common practice, no source). */
const LAST_CHECK_IN_CURRENT_HOURS = 24;

export async function generateMetadata() {
  const t = await getTranslations("Today");
  return { title: t("title") };
}

/** A check-in answered within the hours its advice holds for. */
function isCurrent(at: Date): boolean {
  return Date.now() - at.getTime() <= LAST_CHECK_IN_CURRENT_HOURS * 3_600_000;
}

export default async function TodayPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<{ patient?: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Today");
  const tc = await getTranslations("CheckIn");
  const format = await getFormat();
  const glossary = await glossaryEntries();
  const all = await portalPatients(viewer);
  const patient = await portalPatient(viewer, (await searchParams).patient);
  if (!patient) {
    // A carer whose link was removed is told so, not "not linked yet".
    const removed = viewer.role === "carer" ? (await listRemovedCarerLinks({ carerUserId: viewer.userId }))[0] : undefined;
    const tr = await getTranslations("PortalReach.carers");
    return (
      <div className="flex flex-col gap-5">
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        {removed ? (
          <Card className="flex flex-col gap-2" data-testid="carer-removed">
            <h2 className="text-xl font-bold">{tr("removedTitle", { name: removed.givenName })}</h2>
            <p>{tr("removedBody", { name: removed.givenName, date: format.dateTime(removed.revokedAt ?? new Date(), { day: "numeric", month: "long", year: "numeric" }) })}</p>
          </Card>
        ) : (
          <p>{t("noPatient")}</p>
        )}
      </div>
    );
  }
  const [summary, bags, removal] = await Promise.all([
    getTodaySummary({ patientId: patient.id }),
    getLastBagChanges({ patientId: patient.id }),
    getLastRemoval({ patientId: patient.id }),
  ]);
  // No catheter in place after a removal: guidance for after the catheter, no bag or valve buttons.
  const after = !summary?.episode && removal ? { removal, contacts: await getHelpContacts({ patientId: patient.id }) } : null;
  const today = todayIso();
  const day = (d: string) => format.dateTime(new Date(`${d}T12:00:00Z`), { weekday: "long", day: "numeric", month: "long", timeZone: "UTC" });
  const daysUntil = (d: string) => parseIsoDate("date", d) - parseIsoDate("today", today);
  const schedule = bagSchedule(bags, today);
  const carerOf = subjectName(viewer, patient);
  const tr = await getTranslations("PortalReach.carers");
  const change = summary?.episode ? daysUntil(summary.episode.plannedChangeOn) : null;

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <PatientSwitcher patients={all} currentId={patient.id} path="/today" />
      {carerOf ? <p className="text-lg">{t("caringFor", { name: carerOf })}</p> : null}

      <Link
        href={{ pathname: "/check-in", query: all.length > 1 ? { patient: patient.id } : {} }}
        className="flex min-h-16 items-center justify-center rounded-lg bg-brand px-4 py-3 text-center text-xl font-bold text-white"
        data-testid="start-check-in"
      >
        {t("startCheckIn")}
      </Link>

      {after ? <AfterCatheter removal={after.removal} contacts={after.contacts} /> : (<>
      <Card className="flex flex-col gap-2">
        <h2 className="text-xl font-bold">{t("nextChange")}</h2>
        {summary?.episode ? (
          <>
            <p className="text-2xl font-bold" data-testid="next-change">
              {day(summary.episode.plannedChangeOn)}
            </p>
            <DueWords days={change!} testId="next-change-due" />
          </>
        ) : (
          <p>{t("noCatheter")}</p>
        )}
      </Card>

      <Card className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">{t("bags.title")}</h2>
        {schedule.length ? (
          <ul className="flex flex-col gap-2">
            {schedule.map((b) => (
              <li key={b.kind} data-testid={`next-${b.kind}`}>
                <span className="font-bold">
                  <WithTerms text={t(b.kind === "leg-bag" ? "bags.nextLegBag" : "bags.nextValve")} glossary={glossary} />
                </span>{" "}
                <span className="font-bold">{day(b.nextOn)}</span>
                <br />
                <span className={b.state === "ok" ? "" : "font-bold text-level-urgent-ink"}>
                  {b.state === "overdue" ? t("bags.overdue") : b.state === "due-today" ? t("bags.dueToday") : t("bags.inDays", { days: b.daysUntil })}
                </span>
              </li>
            ))}
          </ul>
        ) : (
          <p>
            <WithTerms text={t("bags.none", { days: BAG_INTERVALS.legBagDays.value })} glossary={glossary} />
          </p>
        )}
        <BagChangeButtons patientId={patient.id} />
        <p className="text-ink-soft">
          <WithTerms text={t("bags.nightBag")} glossary={glossary} />
        </p>
      </Card>
      </>)}

      <Card className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">{carerOf ? tr("carerLastCheckIn", { name: patient.givenName }) : t("lastCheckInTitle")}</h2>
        {summary?.lastCheckIn ? (
          <>
            <LevelBadge level={summary.lastCheckIn.level} size="small" />
            <p>{t("lastCheckIn", { when: format.dateTime(summary.lastCheckIn.at, { weekday: "long", day: "numeric", month: "long", hour: "numeric", minute: "2-digit" }) })}</p>
            {isCurrent(summary.lastCheckIn.at) ? (
              <p className="font-bold" data-testid="last-check-in-advice">
                {tc(`advice.${LEVEL_STEP_KEY[summary.lastCheckIn.level]}`)}
              </p>
            ) : (
              // An old instruction is history, not today's instruction.
              <>
                <p className="font-bold" data-testid="last-check-in-old">
                  {t("lastCheckInOld")}
                </p>
                <p className="text-ink-soft">{t("lastCheckInThen", { advice: tc(`advice.${LEVEL_STEP_KEY[summary.lastCheckIn.level]}`) })}</p>
              </>
            )}
          </>
        ) : (
          <p>{t("noCheckIn")}</p>
        )}
      </Card>

      <RecentCheckIns patientId={patient.id} carerOf={carerOf ? patient.givenName : null} />

      <Link href="/help" className="flex min-h-14 items-center justify-center rounded-lg border-2 border-level-emergency bg-level-emergency-soft px-4 text-lg font-bold text-level-emergency-ink">
        {t("getHelp")}
      </Link>
    </div>
  );
}
