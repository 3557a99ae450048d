"use client";
import { useTranslations } from "next-intl";
import { parseRangeCode } from "@/lib/shared/numbers";

/**
 * The words for a schema's range code ("range:5:30:ml" → "Enter a number between 5 and 30 ml"),
 * or null for any other code, which the form translates as before.
 */
export function useRangeText() {
  const t = useTranslations("Errors");
  return (code: unknown): string | null => {
    const r = parseRangeCode(code);
    if (!r) return null;
    return r.unit ? t("rangeUnit", { min: r.min, max: r.max, unit: t(`units.${r.unit}`) }) : t("range", { min: r.min, max: r.max });
  };
}
