import { getTranslations } from "next-intl/server";
import type { ReactNode } from "react";
import { ReadingComfortForm } from "@/components/account/reading-comfort";
import { PendingCheckInWarning } from "@/components/check-in/pending-warning";
import { getReadingComfort } from "@/db/queries/reading";
import { LanguageSwitcher } from "@/components/layout/language-switcher";
import { BellIcon, BookIcon, ExitIcon, GlobeIcon, KeyIcon, LifebuoyIcon, PeopleIcon, TubeIcon } from "@/components/portal/nav-icons";
import { buttonClass } from "@/components/ui/button";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { portalPatient, portalPatients } from "@/lib/portal";
import { CarerAlertToggle } from "@/components/carers/carer-alert-toggle";
import { getCarerAlert } from "@/db/queries/invitations";

export async function generateMetadata() {
  const t = await getTranslations("More");
  return { title: t("title") };
}

export default async function MorePage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("More");
  const tr = await getTranslations("PortalReach");
  const tReminders = await getTranslations("Reminders");
  // Only the patient downloads their own data (a carer cannot; an admin does it on request).
  const ownPatient = viewer.role === "patient" ? await portalPatient(viewer, undefined) : null;
  // A carer speaks of the patient by name, and chooses for each whether to be told of urgent check-ins.
  const cared = viewer.role === "carer" ? await portalPatients(viewer) : [];
  const alerts = await Promise.all(cared.map(async (p) => ({ p, choice: (await getCarerAlert({ patientId: p.id, carerUserId: viewer.userId })) ?? { on: false, channel: "email" as const } })));
  const item = (href: string, icon: ReactNode, label: string) => (
    <li>
      <Link href={href} className="flex min-h-16 items-center gap-4 rounded-lg border-2 border-brand bg-paper-raised px-4 py-2 text-xl font-bold text-brand hover:bg-brand-soft">
        {icon}
        <span>{label}</span>
      </Link>
    </li>
  );
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("signedInAs", { name: viewer.name })}</p>
      <ul className="flex flex-col gap-3">
        {item("/my-catheter", <TubeIcon className="h-8 w-8 shrink-0" />, cared[0] ? tr("carers.carerMyCatheter", { name: cared[0].givenName }) : t("myCatheter"))}
        {item("/learn", <BookIcon className="h-8 w-8 shrink-0" />, t("learn"))}
        {item("/people", <PeopleIcon className="h-8 w-8 shrink-0" />, t("people"))}
        {item("/help", <LifebuoyIcon className="h-8 w-8 shrink-0" />, t("help"))}
        {item("/more/check-ins", <TubeIcon className="h-8 w-8 shrink-0" />, tr("history.link"))}
        {item("/more/reminders", <BellIcon className="h-8 w-8 shrink-0" />, tReminders("link"))}
        {viewer.role === "patient" ? item("/more/access", <KeyIcon className="h-8 w-8 shrink-0" />, tr("access.link")) : null}
        {item("/more/security", <KeyIcon className="h-8 w-8 shrink-0" />, t("security.title"))}
      </ul>
      {alerts.length ? (
        <section aria-labelledby="carer-alerts" className="flex flex-col gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4">
          <h2 id="carer-alerts" className="text-xl font-bold">
            {tr("carers.alertsTitle")}
          </h2>
          {alerts.map(({ p, choice }) => (
            <CarerAlertToggle key={p.id} patientId={p.id} givenName={p.givenName} initial={choice.on} initialChannel={choice.channel} />
          ))}
        </section>
      ) : null}
      {ownPatient ? (
        <section aria-labelledby="your-data" className="flex flex-col gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4">
          <h2 id="your-data" className="text-xl font-bold">
            {t("data.title")}
          </h2>
          <p>{t("data.body")}</p>
          <a href={`/api/patients/${ownPatient.id}/export`} download className={buttonClass("secondary")}>
            {t("data.json")}
          </a>
          <a href={`/api/patients/${ownPatient.id}/export?format=fhir`} download className={buttonClass("secondary")}>
            {t("data.fhir")}
          </a>
        </section>
      ) : null}
      <ReadingComfortForm initial={await getReadingComfort({ userId: viewer.userId })} />
      <div className="flex items-center gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4">
        <GlobeIcon className="h-8 w-8 shrink-0 text-brand" />
        <LanguageSwitcher />
      </div>
      <PendingCheckInWarning />
      <Link href="/sign-out" className="flex min-h-14 items-center justify-center gap-3 rounded-lg border-2 border-stone-line px-4 font-bold text-ink">
        <ExitIcon />
        <span>{t("signOut")}</span>
      </Link>
    </div>
  );
}
