import { getTranslations } from "next-intl/server";
import { CheckInFlow } from "@/components/check-in/check-in-flow";
import { glossaryEntries } from "@/components/glossary/with-terms";
import { getActiveRoute } from "@/db/queries/check-ins";
import { getHelpContacts } from "@/db/queries/contacts";
import { getLastRemoval } from "@/db/queries/episodes";
import { requirePageRole } from "@/lib/auth/permissions";
import { portalPatient, subjectName } from "@/lib/portal";

export async function generateMetadata() {
  const t = await getTranslations("CheckIn");
  return { title: t("title") };
}

export default async function CheckInPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<{ patient?: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Today");
  const patient = await portalPatient(viewer, (await searchParams).patient);
  if (!patient) return <p>{t("noPatient")}</p>;
  const [route, contacts, lastRemoval, glossary] = await Promise.all([
    getActiveRoute({ patientId: patient.id }),
    getHelpContacts({ patientId: patient.id }),
    getLastRemoval({ patientId: patient.id }),
    glossaryEntries(),
  ]);
  // The same rule as the server's (lib/portal/check-ins.ts): none in place, and one came out.
  const afterCatheter = route === null && lastRemoval !== null;
  return <CheckInFlow patientId={patient.id} route={route} afterCatheter={afterCatheter} contacts={contacts} patientName={subjectName(viewer, patient)} glossary={glossary} />;
}
