import { getTranslations } from "next-intl/server";
import { UploadsPanel } from "@/components/uploads/uploads-panel";
import { listUploads } from "@/db/queries/uploads";
import { openRecordPage } from "@/lib/records/patient-record-page";

export async function generateMetadata() {
  const t = await getTranslations("Documents");
  return { title: t("title") };
}

export default async function DocumentsTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  const { via, closed } = await openRecordPage({ locale, patientId, action: "patient.view.uploads" });
  const uploads = await listUploads({ patientId });
  // Removing is for the care team (the route refuses visit access too).
  return <UploadsPanel patientId={patientId} initial={uploads} canRemove={via === "care_team" && !closed} readOnly={closed} />;
}
