import { getTranslations } from "next-intl/server";

/** A date's distance from today in words: overdue by N days, due today, or in N days. */
export async function DueWords({ days, testId }: { days: number; testId?: string }) {
  const t = await getTranslations("Portal.due");
  const text = days < 0 ? t("overdue", { days: -days }) : days === 0 ? t("today") : t("inDays", { days });
  return (
    <p className={days < 0 ? "font-bold text-level-urgent-ink" : ""} data-testid={testId} data-days={days}>
      {text}
    </p>
  );
}
