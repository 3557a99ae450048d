import { getTranslations } from "next-intl/server";
import { WithTerms } from "@/components/glossary/glossary-term";
import { glossaryEntries } from "@/components/glossary/with-terms";
import { CallButtons } from "@/components/portal/call-buttons";
import { EmergencyIcon, UrgentIcon } from "@/components/ui/level-marks";
import { getHelpContacts } from "@/db/queries/contacts";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { portalPatient } from "@/lib/portal";

export async function generateMetadata() {
  const t = await getTranslations("Help");
  return { title: t("title") };
}

/** Get help: the numbers first, then the signs that mean call now, then a check-in. */
export default async function HelpPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<{ patient?: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Help");
  const patient = await portalPatient(viewer, (await searchParams).patient);
  const [contacts, glossary] = await Promise.all([getHelpContacts({ patientId: patient?.id ?? null }), glossaryEntries()]);
  const emergencySigns = ["confused", "breathless", "veryUnwell", "shaking", "noUrine18"] as const;
  const urgentSigns = ["notDraining", "cameOut", "fever", "blood", "pain"] as const;
  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <CallButtons contacts={contacts} />

      <section aria-labelledby="help-emergency" className="flex flex-col gap-3 rounded-card border-4 border-level-emergency bg-level-emergency-soft p-4 text-level-emergency-ink">
        <h2 id="help-emergency" className="flex items-center gap-3 text-2xl font-bold">
          <span className="text-level-emergency">
            <EmergencyIcon className="h-10 w-10 shrink-0" />
          </span>
          {t("emergencyTitle")}
        </h2>
        <ul className="flex list-disc flex-col gap-1 ps-6">
          {emergencySigns.map((s) => (
            <li key={s}>
              <WithTerms text={t(`emergency.${s}`)} glossary={glossary} />
            </li>
          ))}
        </ul>
      </section>

      <section aria-labelledby="help-urgent" className="flex flex-col gap-3 rounded-card border-4 border-level-urgent bg-level-urgent-soft p-4 text-level-urgent-ink">
        <h2 id="help-urgent" className="flex items-center gap-3 text-2xl font-bold">
          <span className="text-level-urgent">
            <UrgentIcon className="h-10 w-10 shrink-0" />
          </span>
          {t("urgentTitle")}
        </h2>
        <ul className="flex list-disc flex-col gap-1 ps-6">
          {urgentSigns.map((s) => (
            <li key={s}>
              <WithTerms text={t(`urgent.${s}`)} glossary={glossary} />
            </li>
          ))}
        </ul>
      </section>

      <p>{t("notSure")}</p>
      <Link href="/check-in" className="flex min-h-16 items-center justify-center rounded-lg bg-brand px-4 text-xl font-bold text-white">
        {t("checkIn")}
      </Link>
      <Link href="/learn/when-to-get-help" className="flex min-h-14 items-center justify-center rounded-lg border-2 border-brand px-4 font-bold text-brand">
        {t("readMore")}
      </Link>
      <p className="text-ink-soft">{t("general")}</p>
    </div>
  );
}
