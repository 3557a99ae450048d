import { getTranslations } from "next-intl/server";
import type { ReactNode } from "react";
import { ListenControl } from "@/components/portal/listen";
import { LifebuoyIcon } from "@/components/portal/nav-icons";
import { OutboxSync } from "@/components/portal/outbox-sync";
import { ServiceWorkerRegister } from "@/components/portal/service-worker-register";
import { PatientTranslationNote } from "@/components/translation/translation-status";
import { Wordmark } from "@/components/ui/logo";
import { getEmergencyNumber } from "@/lib/config/settings";
import type { ReadingComfort } from "@/lib/validations/reading";
import { Link } from "@/lib/i18n/navigation";
import { PortalNav } from "./portal-nav";

/** Patient and carer pages: phone first, one column, large type, "Get help" always one tap away. */
export async function PortalShell({ children, reading }: { children: ReactNode; reading: ReadingComfort }) {
  const t = await getTranslations("Portal");
  return (
    // The person's reading comfort: app/globals.css scales the page and strengthens the colours from these.
    <div
      className="flex min-h-dvh flex-col text-body [overflow-wrap:break-word] max-[22em]:[&_.rounded-card]:p-3"
      data-text-size={reading.textSize}
      data-contrast={reading.contrast}
    >
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:start-2 focus:top-2 focus:z-20 focus:bg-paper-raised focus:p-3">
        {t("skip")}
      </a>
      <header className="sticky top-0 z-20 border-b border-stone-faint bg-paper-raised">
        <div className="mx-auto flex max-w-xl flex-wrap items-center justify-between gap-2 px-4 py-2 max-[22em]:justify-center max-[22em]:py-1">
          <Link href="/today" className="flex min-h-12 items-center max-[22em]:hidden">
            <Wordmark size="md" />
          </Link>
          <Link
            href="/help"
            className="flex min-h-12 flex-wrap items-center gap-2 rounded-lg border-2 border-level-emergency bg-level-emergency-soft px-4 font-bold text-level-emergency-ink"
            data-testid="get-help"
          >
            <LifebuoyIcon />
            <span>{t("getHelp")}</span>
          </Link>
        </div>
      </header>
      <main id="main" className="mx-auto w-full max-w-xl flex-1 px-4 pb-36 pt-5 max-[22em]:px-2 max-[22em]:pb-8 in-data-[text-size=3]:pb-8">
        <OutboxSync />
        <ListenControl emergencyNumber={await getEmergencyNumber()} />
        {children}
        <PatientTranslationNote />
      </main>
      <PortalNav />
      <ServiceWorkerRegister />
    </div>
  );
}
