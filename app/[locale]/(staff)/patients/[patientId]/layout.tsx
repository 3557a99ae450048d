import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import type { ReactNode } from "react";
import { AllergyBox } from "@/components/patient-record/allergy-box";
import { RecordTabs } from "@/components/patient-record/record-tabs";
import { getPatientRecord } from "@/db/queries/patients";
import { checkRecordAccess, recordClosedAt } from "@/lib/records/patient-record-page";
import { ageOn } from "@/lib/shared/time-zone";

export default async function PatientRecordLayout({ children, params }: { children: ReactNode; params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  const { via } = await checkRecordAccess(locale, patientId);
  const [record, closedAt] = await Promise.all([getPatientRecord({ patientId }), recordClosedAt(patientId)]);
  if (!record) notFound();
  const t = await getTranslations("PatientRecord");
  const v = await getTranslations("Vocabulary");
  const format = await getFormat();
  const { patient, currentEpisode: e } = record;
  return (
    <div className="flex flex-col gap-5">
      <header className="flex flex-col gap-3">
        <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
          <h1 className="text-3xl font-bold">
            {patient.givenName} {patient.familyName}
          </h1>
          <p className="tabular text-lg">
            {t("age", { years: ageOn(patient.dateOfBirth) })} · {t("born", { date: format.dateTime(new Date(`${patient.dateOfBirth}T12:00:00Z`), { dateStyle: "medium" }) })} ·{" "}
            <span className="font-bold">{t("hrn", { hrn: patient.healthRecordNumber })}</span>
          </p>
        </div>
        <p className="tabular text-lg" data-testid="record-device">
          {e ? (
            <>
              <span className="font-bold">{v(`route.${e.route}`)}</span> · {v("device.sizeCh", { ch: e.sizeCh })} · {t("balloon", { ml: e.balloonMl })}
            </>
          ) : (
            t("noDevice")
          )}
        </p>
        {via === "visit_access" ? (
          <p className="rounded-lg border-2 border-level-soon bg-level-soon-soft p-2 font-bold text-level-soon-ink">{t("visitAccess")}</p>
        ) : null}
        {closedAt ? (
          <p role="note" className="rounded-lg border-2 border-stone-line bg-paper-sunk p-3 font-bold" data-testid="record-closed">
            {t("closedBanner", { date: format.dateTime(closedAt, { dateStyle: "long" }) })}
          </p>
        ) : null}
        <AllergyBox allergies={patient.allergies} />
      </header>
      <RecordTabs patientId={patientId} />
      <div>{children}</div>
    </div>
  );
}
