import { getTranslations, setRequestLocale } from "next-intl/server";
import type { ReactNode } from "react";
import { ClientMessages } from "@/components/i18n/client-messages";
import { Wordmark } from "@/components/ui/logo";

// The public passport pages: plain, server-rendered, no navigation (a stranger holds the QR).
export default async function PassportLayout({ children, params }: { children: ReactNode; params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("DeviceCard");
  return (
    <ClientMessages scope="card">
      <div className="words-whole flex min-h-dvh flex-col text-body [overflow-wrap:break-word]">
        <header className="px-5 py-4">
          <Wordmark size="lg" />
        </header>
        <main className="mx-auto flex w-full max-w-xl flex-1 flex-col px-5 pb-12">{children}</main>
        <footer className="px-5 py-4 text-center text-sm text-ink-soft">{t("footer")}</footer>
      </div>
    </ClientMessages>
  );
}
