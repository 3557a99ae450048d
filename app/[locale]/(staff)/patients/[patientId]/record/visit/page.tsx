import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { notFound } from "next/navigation";
import { News2Panel } from "@/components/visit-form/news2-panel";
import { VisitForm } from "@/components/visit-form/visit-form";
import { getRecordingContext } from "@/db/queries/episodes";
import { getLastVisitFindings, listObservations } from "@/db/queries/observations";
import { getHelpContacts } from "@/db/queries/contacts";
import { Link } from "@/lib/i18n/navigation";
import { openRecordPage } from "@/lib/records/patient-record-page";

type Params = { locale: string; patientId: string };

export async function generateMetadata() {
  const t = await getTranslations("VisitForm");
  return { title: t("title") };
}

// Record a visit with NEWS2 (care team or visit access; the record layout shows who and how).
export default async function RecordVisitPage({ params }: { params: Promise<Params> }) {
  const { locale, patientId } = await params;
  await openRecordPage({ locale, patientId, action: "visit.form" });
  const [context, previous, contacts, last] = await Promise.all([
    getRecordingContext({ patientId }),
    listObservations({ patientId, limit: 5 }),
    getHelpContacts({ patientId }),
    getLastVisitFindings({ patientId }),
  ]);
  if (!context.patient) notFound();
  const t = await getTranslations("VisitForm");
  const format = await getFormat();
  const record = `/patients/${patientId}`;
  let body;
  if (context.patient.closed) body = <p className="font-bold">{t("closed")}</p>;
  else if (!context.latest) body = <p className="font-bold" data-testid="visit-no-episode">{t("noEpisode")}</p>;
  else body = <VisitForm patientId={patientId} contacts={contacts} last={last} />;
  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-col gap-1">
        <Link href={record} className="self-start font-bold text-brand underline underline-offset-4">
          {t("backToRecord")}
        </Link>
        <h2 className="text-2xl font-bold" data-testid="record-title">
          {t("title")}
        </h2>
      </div>
      {body}
      <section className="flex max-w-3xl flex-col gap-3">
        <h3 className="text-xl font-bold">{t("previousTitle")}</h3>
        {previous.length === 0 ? <p>{t("noPrevious")}</p> : null}
        {previous.map((o) => (
          <div key={o.id} className="flex flex-col gap-2">
            <p className="tabular font-bold">
              {format.dateTime(new Date(o.takenAt), { dateStyle: "medium", timeStyle: "short" })} · {t("by", { name: o.recordedByName })}
            </p>
            <News2Panel score={o.news2} values={o.values} testId="news2-previous" showResponse={false} />
          </div>
        ))}
      </section>
    </div>
  );
}
