import { getTranslations } from "next-intl/server";
import { WithTerms } from "@/components/glossary/glossary-term";
import { glossaryEntries } from "@/components/glossary/with-terms";
import { getFormat } from "@/lib/i18n/format";
import { SitePhotoUpload } from "@/components/my-catheter/site-photo-upload";
import { PatientSwitcher } from "@/components/portal/patient-switcher";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { getMyCatheter } from "@/db/queries/portal";
import { requirePageRole } from "@/lib/auth/permissions";
import { portalPatient, portalPatients, subjectName } from "@/lib/portal";
import { allergySummary } from "@/lib/clinical/allergies";
import { parseIsoDate } from "@/lib/clinical";
import { todayIso } from "@/lib/shared/time-zone";
import { DueWords } from "@/components/portal/due-words";
import type { ReactNode } from "react";

export async function generateMetadata() {
  const t = await getTranslations("MyCatheter");
  return { title: t("title") };
}

export default async function MyCatheterPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<{ patient?: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const v = await getTranslations("Vocabulary");
  const t = await getTranslations("MyCatheter");
  const format = await getFormat();
  const glossary = await glossaryEntries();
  const patient = await portalPatient(viewer, (await searchParams).patient);
  if (!patient) return <p>{(await getTranslations("Today"))("noPatient")}</p>;
  const { episode, allergies } = await getMyCatheter({ patientId: patient.id });
  const day = (d: string) => format.dateTime(new Date(`${d}T12:00:00Z`), { weekday: "long", day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });
  const carerOf = subjectName(viewer, patient);
  const summary = allergies ? allergySummary(allergies) : { present: [], notRecorded: [] };
  const allergyList = [...summary.present.map((a) => v(`allergen.${a}`)), ...(allergies?.other ? [allergies.other] : [])];
  const notAsked = summary.notRecorded.map((a) => v(`allergen.${a}`)).join(", ");
  const today = todayIso();
  const daysUntil = (d: string) => parseIsoDate("date", d) - parseIsoDate("today", today);
  const row = (label: string, value: string, testId?: string, more?: ReactNode) => (
    <div className="flex flex-col border-b border-stone-faint py-2 last:border-b-0">
      <dt className="text-ink-soft">
        <WithTerms text={label} glossary={glossary} />
      </dt>
      <dd className="text-xl font-bold tabular" data-testid={testId}>
        <WithTerms text={value} glossary={glossary} />
      </dd>
      {more ? <dd>{more}</dd> : null}
    </div>
  );
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{carerOf ? (await getTranslations("PortalReach.carers"))("carerMyCatheter", { name: patient.givenName }) : t("title")}</h1>
      <PatientSwitcher patients={await portalPatients(viewer)} currentId={patient.id} path="/my-catheter" />
      {carerOf ? <p className="text-lg">{(await getTranslations("Today"))("caringFor", { name: carerOf })}</p> : null}
      {episode ? (
        <Card>
          <dl>
            {row(t("route"), t(`routes.${episode.route}`))}
            {row(t("size"), t("sizeValue", { ch: episode.sizeCh }), "size")}
            {row(t("balloon"), t("balloonValue", { ml: episode.balloonMl }))}
            {row(t("type"), t(`types.${episode.catheterType}`))}
            {row(t("material"), t(`materials.${episode.material}`))}
            {row(t("insertedOn"), t("insertedValue", { date: format.dateTime(episode.insertedAt, { weekday: "long", day: "numeric", month: "long", year: "numeric" }), name: episode.insertedByName }))}
            {row(t("nextChange"), day(episode.plannedChangeOn), "next-change", <DueWords days={daysUntil(episode.plannedChangeOn)} testId="next-change-due" />)}
            {row(t("review"), day(episode.reviewDueOn), "review", <DueWords days={daysUntil(episode.reviewDueOn)} testId="review-due" />)}
          </dl>
          {episode.awaitingTwoc ? <p className="mt-3 rounded-lg bg-level-soon-soft p-3 text-level-soon-ink">{t("twoc")}</p> : null}
        </Card>
      ) : (
        <p>{t("none")}</p>
      )}
      <Card className="flex flex-col gap-2">
        <h2 className="text-xl font-bold">{t("allergiesTitle")}</h2>
        {allergyList.length ? (
          <ul className="flex list-disc flex-col gap-1 ps-6 font-bold">
            {allergyList.map((a) => (
              <li key={String(a)}>{a}</li>
            ))}
          </ul>
        ) : notAsked ? null : (
          <p>{t("noAllergies")}</p>
        )}
        {notAsked ? (
          <p className="font-bold" data-testid="allergy-not-recorded">
            {t("allergyNotRecorded", { allergens: notAsked })}
          </p>
        ) : null}
        <p className="text-ink-soft">{t("wrong")}</p>
      </Card>
      <Card className="flex flex-col gap-2">
        <h2 className="text-xl font-bold">{t("bookletTitle")}</h2>
        <p>{t("bookletHint")}</p>
        <a href={`/api/portal/booklet?patient=${patient.id}`} download className={buttonClass("secondary", "self-start")} data-testid="booklet-download">
          {t("bookletLink")}
        </a>
      </Card>
      <SitePhotoUpload patientId={patient.id} />
    </div>
  );
}
