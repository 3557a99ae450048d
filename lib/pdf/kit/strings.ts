import "server-only";
// Translations for PDFs from the same catalogues as the pages (lib/i18n/catalogues).
import { catalogueLocale, formatterFor, translatorFor } from "@/lib/i18n/catalogues";
import { directionOf } from "@/lib/i18n/routing";
import type { TranslationReview } from "@/lib/validations/settings";

/** The PassportPdf translator, formatter and writing direction for one locale. */
export function pdfStrings(locale: string, region: string | null, review: TranslationReview | null = null) {
  const l = catalogueLocale(locale);
  const t = translatorFor(l, "PassportPdf");
  /** The record's words (routes, materials, reasons…), from the one Vocabulary namespace. */
  const v = translatorFor(l, "Vocabulary");
  const format = formatterFor(l, region);
  const rtl = directionOf(l) === "rtl";
  /** Date-only values (YYYY-MM-DD) are calendar days: format them at noon UTC so no zone shifts them. */
  const day = (iso: string | null | undefined) =>
    iso ? format.dateTime(new Date(`${iso}T12:00:00Z`), { dateStyle: "long", timeZone: "UTC" }) : "—";
  const moment = (d: Date | null | undefined) => (d ? format.dateTime(d, { dateStyle: "long" }) : "—");
  const number = (n: number, maximumFractionDigits = 1) => format.number(n, { maximumFractionDigits });
  return { locale: l, t, v, format, rtl, day, moment, number, review };
}

export type PdfStrings = ReturnType<typeof pdfStrings>;
