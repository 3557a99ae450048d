import { getTranslations } from "next-intl/server";
import { PatientForm } from "@/components/patient-form/patient-form";
import { listCareTeamOptions, listGpPracticeDirectory } from "@/db/queries/patients";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("PatientForm");
  return { title: t("title") };
}

export default async function RegisterPatientPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "clinician");
  const t = await getTranslations("PatientForm");
  const [careTeamOptions, gpPractices] = await Promise.all([
    listCareTeamOptions({ organisationIds: viewer.organisationIds }),
    listGpPracticeDirectory(),
  ]);
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      <PatientForm mode="create" careTeamOptions={careTeamOptions} gpPractices={gpPractices} />
    </div>
  );
}
