import { getTranslations } from "next-intl/server";
import type { ReactNode } from "react";
import { LogoMark } from "@/components/ui/logo";
import { Link } from "@/lib/i18n/navigation";
import { LanguageSwitcher } from "./language-switcher";

/** Patient and carer pages: phone first, one column, large type, help always one tap away. */
export async function PortalShell({ children }: { children: ReactNode }) {
  const t = await getTranslations("Nav");
  return (
    <div className="flex min-h-dvh flex-col text-body">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:start-2 focus:top-2 focus:bg-paper-raised focus:p-2">
        {t("skip")}
      </a>
      <header className="flex items-center justify-between gap-3 border-b border-stone-faint bg-paper-raised px-4 py-3">
        <Link href="/today" className="flex min-h-12 items-center gap-2 text-xl font-bold text-brand">
          <LogoMark />
          <span>Caddis</span>
        </Link>
        <LanguageSwitcher />
      </header>
      <main id="main" className="mx-auto w-full max-w-xl flex-1 px-4 pb-28 pt-5">
        {children}
      </main>
      <nav aria-label={t("label")} className="fixed inset-x-0 bottom-0 flex border-t border-stone-faint bg-paper-raised">
        <Link href="/today" className="flex min-h-16 flex-1 items-center justify-center font-bold text-brand">
          {t("today")}
        </Link>
        <Link href="/sign-out" className="flex min-h-16 flex-1 items-center justify-center font-bold text-brand">
          {t("signOut")}
        </Link>
      </nav>
    </div>
  );
}
