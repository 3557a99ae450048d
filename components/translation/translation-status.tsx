import { getLocale, getTranslations } from "next-intl/server";
import { getSettings } from "@/lib/config/settings";
import { getFormat } from "@/lib/i18n/format";
import { localeNames, type Locale } from "@/lib/i18n/routing";
import type { TranslationReview } from "@/lib/validations/settings";

const reviewDay = (format: Awaited<ReturnType<typeof getFormat>>, r: TranslationReview) =>
  format.dateTime(new Date(`${r.reviewedOn}T12:00:00Z`), { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });

/**
 * The foot of every patient page in a translated language: once, quietly, whether a medical
 * translator has reviewed its texts (Settings, recorded by an admin). Nothing in English, the source.
 */
export async function PatientTranslationNote() {
  const locale = await getLocale();
  if (locale === "en") return null;
  const [t, format, settings] = await Promise.all([getTranslations("TranslationReview"), getFormat(), getSettings()]);
  const review = (settings.translationReviews as Record<string, TranslationReview | undefined>)[locale];
  return (
    <p className="mt-10 border-t border-stone-faint pt-3 text-sm text-ink-soft" data-listen="skip" data-testid="translation-note" data-reviewed={review ? "yes" : "no"}>
      {review ? t("reviewedFooter", { date: reviewDay(format, review) }) : t("notReviewedFooter")}
    </p>
  );
}

/** For staff: each translated language of a patient's texts, reviewed (by whom, when) or the caution. */
export async function StaffTranslationStatus({ locales }: { locales: string[] }) {
  const translated = locales.filter((l) => l !== "en");
  if (!translated.length) return null;
  const [t, format, settings] = await Promise.all([getTranslations("TranslationReview"), getFormat(), getSettings()]);
  return (
    <ul className="flex flex-col gap-1 text-sm" data-testid="staff-translation-status">
      {translated.map((l) => {
        const review = (settings.translationReviews as Record<string, TranslationReview | undefined>)[l];
        const language = localeNames[l as Locale] ?? l;
        return (
          <li key={l} className={review ? "text-ink-soft" : "font-bold text-level-soon-ink"}>
            {review ? t("staffReviewed", { language, name: review.reviewerName, date: reviewDay(format, review) }) : t("staffCaution", { language })}
          </li>
        );
      })}
    </ul>
  );
}
