import type { Metadata, Viewport } from "next";
import { hasLocale } from "next-intl";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { ClientMessages } from "@/components/i18n/client-messages";
import { Providers } from "@/components/providers";
import { fontVariables } from "@/lib/i18n/fonts";
import { directionOf, routing } from "@/lib/i18n/routing";
import "../globals.css";

export function generateStaticParams() {
  return routing.locales.map((locale) => ({ locale }));
}

export async function generateMetadata({ params }: { params: Promise<{ locale: string }> }): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale: hasLocale(routing.locales, locale) ? locale : "en", namespace: "Common" });
  return {
    title: { default: "Caddis", template: "%s · Caddis" },
    description: t("tagline"),
    icons: { icon: "/icon.svg" },
    robots: { index: false, follow: false },
  };
}

export const viewport: Viewport = { themeColor: "#0b5563", width: "device-width", initialScale: 1 };

export default async function LocaleLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ locale: string }>;
}) {
  const { locale } = await params;
  if (!hasLocale(routing.locales, locale)) notFound();
  setRequestLocale(locale);
  return (
    <html lang={locale} dir={directionOf(locale)} className={fontVariables}>
      <body className="bg-paper font-sans text-ink antialiased">
        <ClientMessages scope="root">
          <Providers>{children}</Providers>
        </ClientMessages>
      </body>
    </html>
  );
}
