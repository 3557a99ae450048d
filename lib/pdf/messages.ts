import "server-only";
// Translations for PDFs from the same catalogues as the pages (messages/*.json).
import { createFormatter, createTranslator } from "next-intl";
import ar from "@/messages/ar.json";
import en from "@/messages/en.json";
import es from "@/messages/es.json";
import pl from "@/messages/pl.json";
import ro from "@/messages/ro.json";
import ur from "@/messages/ur.json";
import { directionOf, isLocale, type Locale } from "@/lib/i18n/routing";

const catalogues = { en, es, pl, ro, ar, ur } as const;

export const pdfTimeZone = () => process.env.CADDIS_TIME_ZONE ?? "Europe/London";

export function pdfLocale(locale: string): Locale {
  return isLocale(locale) ? locale : "en";
}

/** The PassportPdf translator, formatter and writing direction for one locale. */
export function pdfStrings(locale: string) {
  const l = pdfLocale(locale);
  const messages = catalogues[l] as typeof en;
  const t = createTranslator({ locale: l, messages, namespace: "PassportPdf" });
  const format = createFormatter({ locale: l, timeZone: pdfTimeZone() });
  const rtl = directionOf(l) === "rtl";
  /** Date-only values (YYYY-MM-DD) are calendar days: format them at noon UTC so no zone shifts them. */
  const day = (iso: string | null | undefined) =>
    iso ? format.dateTime(new Date(`${iso}T12:00:00Z`), { dateStyle: "long", timeZone: "UTC" }) : "—";
  const moment = (d: Date | null | undefined) => (d ? format.dateTime(d, { dateStyle: "long" }) : "—");
  const number = (n: number, maximumFractionDigits = 1) => format.number(n, { maximumFractionDigits });
  return { locale: l, t, format, rtl, day, moment, number };
}

export type PdfStrings = ReturnType<typeof pdfStrings>;
