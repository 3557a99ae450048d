import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { PassportPanel } from "@/components/passport/passport-panel";
import { getPassportOverview } from "@/db/queries/passports";
import { getPatientRecord } from "@/db/queries/patients";
import { passportLanguages } from "@/lib/passport";
import { openRecordPage } from "@/lib/patient-record-page";

export async function generateMetadata() {
  const t = await getTranslations("Passport");
  return { title: t("title") };
}

export default async function PassportTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  await openRecordPage({ locale, patientId, action: "patient.view.passport" });
  const [record, overview] = await Promise.all([getPatientRecord({ patientId }), getPassportOverview({ patientId })]);
  if (!record) notFound();
  return (
    <PassportPanel
      patientId={patientId}
      overview={overview}
      languages={passportLanguages(record.patient.preferredLocale)}
      hasDevice={Boolean(record.currentEpisode)}
    />
  );
}
