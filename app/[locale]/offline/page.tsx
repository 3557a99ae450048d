import { getTranslations, setRequestLocale } from "next-intl/server";
import { LifebuoyIcon, PhoneIcon } from "@/components/portal/nav-icons";
import { Wordmark } from "@/components/ui/logo";
import { telHref } from "@/db/queries/contacts";
import { getEmergencyNumber } from "@/lib/config/settings";

// Kept by the service worker for when the phone has no network. It holds nothing about any
// patient: only the deployment's emergency number and general words.
export async function generateMetadata({ params }: { params: Promise<{ locale: "en" }> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "Offline" });
  return { title: t("title") };
}

export const dynamic = "force-dynamic";

export default async function OfflinePage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("Offline");
  const emergency = await getEmergencyNumber();
  return (
    <main className="words-whole mx-auto flex min-h-dvh max-w-xl flex-col gap-5 p-5 text-body [overflow-wrap:break-word]" data-testid="offline-page">
      <Wordmark size="lg" />
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("body")}</p>
      <section className="flex flex-col gap-3 rounded-card border-4 border-level-emergency bg-level-emergency-soft p-4 text-level-emergency-ink">
        <h2 className="flex items-center gap-2 text-xl font-bold">
          <LifebuoyIcon />
          {t("unwellTitle")}
        </h2>
        <p>{t("unwell")}</p>
        {emergency ? (
          <a href={telHref(emergency)} className="flex min-h-14 items-center gap-3 rounded-lg bg-level-emergency px-4 text-lg font-bold text-white">
            <PhoneIcon className="h-7 w-7 shrink-0" />
            {t("call", { number: `\u2066${emergency}\u2069` })}
          </a>
        ) : (
          <p className="font-bold">{t("noNumber")}</p>
        )}
        <p>{t("phoneWorks")}</p>
      </section>
      <p>{t("checkIns")}</p>
      <a href={`/${locale}/today`} className="flex min-h-14 items-center justify-center rounded-lg bg-brand px-4 text-lg font-bold text-white">
        {t("retry")}
      </a>
    </main>
  );
}
