import "server-only";
// Translating e-mails outside a React request (the worker, route handlers' transactions) with
// next-intl's createTranslator. Staff and GP e-mails use the organisation's locale, patient
// e-mails the patient's preferred locale; anything else falls back to English.
import { catalogueLocale, formatterFor, translatorFor } from "@/lib/i18n/catalogues";

export const emailLocale = catalogueLocale;

export function emailTranslator(locale: string) {
  return translatorFor(locale, "Email");
}
export type EmailT = ReturnType<typeof emailTranslator>;

/** The record's words (routes, materials, reasons…) in an e-mail's language. */
export function emailVocabulary(locale: string) {
  return translatorFor(locale, "Vocabulary");
}
export type EmailV = ReturnType<typeof emailVocabulary>;

/** Formats a YYYY-MM-DD calendar date (no time zone shift) or a timestamp, in the deployment's region. */
export function emailDates(locale: string, region: string | null) {
  const f = formatterFor(locale, region);
  return {
    day: (d: string | null | undefined) => (d ? f.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "full", timeZone: "UTC" }) : ""),
    at: (d: Date | null | undefined) => (d ? f.dateTime(d, { dateStyle: "medium", timeStyle: "short" }) : ""),
    short: (d: string | Date | null | undefined) =>
      d ? f.dateTime(typeof d === "string" ? new Date(`${d}T12:00:00Z`) : d, { dateStyle: "medium", timeZone: typeof d === "string" ? "UTC" : undefined }) : "",
    number: (n: number) => f.number(n),
  };
}
