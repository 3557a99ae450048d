import "server-only";
// Translating e-mails outside a React request (the worker, route handlers' transactions) with
// next-intl's createTranslator. Staff and GP e-mails use the organisation's locale, patient
// e-mails the patient's preferred locale; anything else falls back to English.
import { createFormatter, createTranslator } from "next-intl";
import { env } from "@/lib/config/env";
import { isLocale, type Locale } from "@/lib/i18n/routing";
import ar from "@/messages/ar.json";
import en from "@/messages/en.json";
import es from "@/messages/es.json";
import pl from "@/messages/pl.json";
import ro from "@/messages/ro.json";
import ur from "@/messages/ur.json";

type Messages = typeof en;
const catalogues: Record<Locale, Messages> = { en, es, pl, ro, ar, ur } as Record<Locale, Messages>;

export function emailLocale(value: string | null | undefined): Locale {
  return value && isLocale(value) ? value : "en";
}

export function emailTranslator(locale: string) {
  const l = emailLocale(locale);
  return createTranslator({ locale: l, messages: catalogues[l], namespace: "Email" });
}
export type EmailT = ReturnType<typeof emailTranslator>;

export function emailFormatter(locale: string) {
  return createFormatter({ locale: emailLocale(locale), timeZone: env.CADDIS_TIME_ZONE });
}

/** Formats a YYYY-MM-DD calendar date (no time zone shift) or a timestamp. */
export function emailDates(locale: string) {
  const f = emailFormatter(locale);
  return {
    day: (d: string | null | undefined) => (d ? f.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "full", timeZone: "UTC" }) : ""),
    at: (d: Date | null | undefined) => (d ? f.dateTime(d, { dateStyle: "medium", timeStyle: "short" }) : ""),
    short: (d: string | Date | null | undefined) =>
      d ? f.dateTime(typeof d === "string" ? new Date(`${d}T12:00:00Z`) : d, { dateStyle: "medium", timeZone: typeof d === "string" ? "UTC" : undefined }) : "",
    number: (n: number) => f.number(n),
  };
}
