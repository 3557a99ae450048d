import { getFormatter, getTranslations } from "next-intl/server";
import { Card } from "@/components/ui/card";
import { getTodaySummary } from "@/db/queries/portal";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("Today");
  return { title: t("title") };
}

export default async function TodayPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Today");
  const format = await getFormatter();
  const summaries = (await Promise.all(viewer.patientIds.map((id) => getTodaySummary({ patientId: id })))).filter(
    (s) => s !== null,
  );
  const day = (d: string) =>
    format.dateTime(new Date(`${d}T12:00:00Z`), { weekday: "long", day: "numeric", month: "long", year: "numeric" });
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      {summaries.length === 0 ? <p>{t("noPatient")}</p> : null}
      {summaries.map((s) => (
        <Card key={s.patient.id} className="flex flex-col gap-3">
          {viewer.role === "carer" ? (
            <p className="text-ink-soft">{t("caringFor", { name: `${s.patient.givenName} ${s.patient.familyName}` })}</p>
          ) : null}
          {s.episode ? (
            <>
              <p className="text-sm font-bold uppercase tracking-wide text-ink-soft">{t("nextChange")}</p>
              <p className="text-2xl font-bold">{day(s.episode.plannedChangeOn)}</p>
            </>
          ) : (
            <p>{t("noCatheter")}</p>
          )}
          {s.lastCheckIn ? (
            <p>
              {t("lastCheckIn", {
                when: format.dateTime(s.lastCheckIn.createdAt, { weekday: "long", hour: "numeric", minute: "2-digit" }),
              })}
            </p>
          ) : null}
          {s.team.map((o) =>
            o.phone ? (
              <a
                key={o.name}
                href={`tel:${o.phone.replace(/[^+0-9]/g, "")}`}
                className="flex min-h-12 items-center justify-center rounded-lg border-2 border-brand px-4 font-bold text-brand"
              >
                {t("callTeam", { team: o.name, phone: o.phone })}
              </a>
            ) : null,
          )}
        </Card>
      ))}
    </div>
  );
}
