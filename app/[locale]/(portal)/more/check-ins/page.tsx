// Every check-in of the patient, newest first: when, the level, who answered, and for those that
// went to the care team whether the team has seen it (issue 16's acknowledgement, read from the
// same caseload items). A carer reads it about the patient, by name.
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { LevelBadge } from "@/components/portal/level-badge";
import { PatientSwitcher } from "@/components/portal/patient-switcher";
import { Card } from "@/components/ui/card";
import { listCheckInsWithAcknowledgement } from "@/db/queries/caseload-items";
import { requirePageRole } from "@/lib/auth/permissions";
import { portalPatient, portalPatients } from "@/lib/portal";

/** Enough for months of daily check-ins on one phone screen list. */
const HISTORY_LIMIT = 200;

export async function generateMetadata() {
  const t = await getTranslations("PortalReach.history");
  return { title: t("titleSelf") };
}

export default async function CheckInHistoryPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<{ patient?: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("PortalReach.history");
  const format = await getFormat();
  const all = await portalPatients(viewer);
  const patient = await portalPatient(viewer, (await searchParams).patient);
  if (!patient) {
    return (
      <div className="flex flex-col gap-5">
        <h1 className="text-3xl font-bold">{t("titleSelf")}</h1>
        <p>{t("noPatient")}</p>
      </div>
    );
  }
  const rows = await listCheckInsWithAcknowledgement({ patientId: patient.id, limit: HISTORY_LIMIT });
  const carer = viewer.role === "carer";
  const when = (d: Date) => format.dateTime(d, { weekday: "long", day: "numeric", month: "long", year: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  const who = (r: (typeof rows)[number]) =>
    r.reportedByUserId === viewer.userId ? t("byYou") : r.reporterName ? t("byName", { name: r.reporterName }) : t("byRemoved");

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{carer ? t("titleCarer", { name: patient.givenName }) : t("titleSelf")}</h1>
      <PatientSwitcher patients={all} currentId={patient.id} path="/more/check-ins" />
      {rows.length === 0 ? (
        <p>{carer ? t("emptyCarer", { name: patient.givenName }) : t("emptySelf")}</p>
      ) : (
        <ul className="flex flex-col gap-3" data-testid="check-in-history">
          {rows.map((r) => (
            <li key={r.id}>
              <Card className="flex flex-col gap-1" data-testid="history-check-in" data-level={r.level}>
                <p className="tabular font-bold">{when(r.at)}</p>
                <LevelBadge level={r.level} size="small" />
                <p data-testid="history-who">{who(r)}</p>
                {r.alerted ? (
                  r.seenAt ? (
                    <p className="font-bold" data-testid="history-seen">
                      {t("seen", { when: when(r.seenAt) })}
                    </p>
                  ) : (
                    <p data-testid="history-not-seen">{t("notSeen")}</p>
                  )
                ) : (
                  <p className="text-ink-soft">{t("notSent")}</p>
                )}
              </Card>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
