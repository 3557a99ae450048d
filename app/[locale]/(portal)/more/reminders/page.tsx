import { getTranslations } from "next-intl/server";
import { RemindersForm } from "@/components/reminders/reminders-form";
import { getActiveEpisode } from "@/db/queries/episodes";
import { getReach } from "@/db/queries/reach";
import { mayChooseReminders, requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { portalPatient } from "@/lib/portal";

export async function generateMetadata() {
  const t = await getTranslations("Reminders");
  return { title: t("title") };
}

/** More → Reminders: the patient's reminders; for a carer, her number, quiet hours and notifications. */
export default async function RemindersPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Reminders");
  const withReminders = mayChooseReminders(viewer);
  const own = withReminders ? await portalPatient(viewer, undefined) : null;
  const noCatheter = own ? !(await getActiveEpisode({ patientId: own.id })) : false;
  return (
    <div className="flex flex-col gap-5">
      <Link href="/more" className="text-brand underline underline-offset-4">
        {t("back")}
      </Link>
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <RemindersForm initial={await getReach({ userId: viewer.userId })} withReminders={withReminders} noCatheter={noCatheter} />
    </div>
  );
}
