import { getTranslations } from "next-intl/server";
import type { ReactNode } from "react";
import { ClientMessages } from "@/components/i18n/client-messages";
import { LanguageSwitcher } from "@/components/layout/language-switcher";
import { Wordmark } from "@/components/ui/logo";

export default async function AuthLayout({ children }: { children: ReactNode }) {
  const t = await getTranslations("Common");
  return (
    <ClientMessages scope="auth">
      <div className="words-whole flex min-h-dvh flex-col [overflow-wrap:break-word]">
        <header className="flex flex-wrap items-center justify-between gap-4 px-5 py-4">
          <Wordmark size="lg" />
          <LanguageSwitcher />
        </header>
        <main className="mx-auto flex w-full max-w-md flex-1 flex-col justify-center px-5 pb-16">{children}</main>
        <footer className="px-5 py-4 text-center text-sm text-ink-soft">{t("tagline")}</footer>
      </div>
    </ClientMessages>
  );
}
