import { defineRouting } from "next-intl/routing";

export const locales = ["en", "es", "pl", "ro", "ar", "ur"] as const;
export type Locale = (typeof locales)[number];

/** Locales written right to left. */
export const rtlLocales: readonly Locale[] = ["ar", "ur"];

/** Each language named in itself, for the switcher. */
export const localeNames: Record<Locale, string> = {
  en: "English",
  es: "Español",
  pl: "Polski",
  ro: "Română",
  ar: "العربية",
  ur: "اردو",
};

export const routing = defineRouting({
  locales,
  defaultLocale: "en",
  localePrefix: "always",
  // No `Link: rel=alternate` header: on the device card it would repeat the secret URL, and
  // nothing here is indexed.
  alternateLinks: false,
});

export function isLocale(value: string): value is Locale {
  return (locales as readonly string[]).includes(value);
}

export function directionOf(locale: string): "rtl" | "ltr" {
  return (rtlLocales as readonly string[]).includes(locale) ? "rtl" : "ltr";
}
