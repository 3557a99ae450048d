import { getTranslations } from "next-intl/server";
import { DiaryView } from "@/components/diary/diary-view";
import { PatientSwitcher } from "@/components/portal/patient-switcher";
import { requirePageRole } from "@/lib/auth/permissions";
import { portalPatient, portalPatients, subjectName } from "@/lib/portal";

export async function generateMetadata() {
  const t = await getTranslations("Diary");
  return { title: t("title") };
}

export default async function DiaryPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<{ patient?: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Today");
  const patient = await portalPatient(viewer, (await searchParams).patient);
  if (!patient) return <p>{t("noPatient")}</p>;
  const carerOf = subjectName(viewer, patient);
  return (
    <div className="flex flex-col gap-4">
      <PatientSwitcher patients={await portalPatients(viewer)} currentId={patient.id} path="/diary" />
      {carerOf ? <p className="text-lg">{t("caringFor", { name: carerOf })}</p> : null}
      <DiaryView patientId={patient.id} weightKg={patient.weightKg} fluidLimitMl={patient.fluidLimitMl} />
    </div>
  );
}
