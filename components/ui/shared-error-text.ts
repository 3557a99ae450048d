"use client";
import { useTranslations } from "next-intl";
import { parseRangeCode } from "@/lib/shared/numbers";

/** Codes every schema can give, worded once in Errors (lib/validations/number.ts and text.ts). */
const SHARED_CODES = ["number", "whole_number", "control_character", "one_line", "bidi_control"] as const;

/**
 * The words for a code every form shares — a range ("range:5:30:ml" → "Enter a number between 5
 * and 30 ml"), a number that is not one, a control or bidirectional character — or null for a
 * code the form words itself.
 */
export function useSharedErrorText() {
  const t = useTranslations("Errors");
  return (code: unknown): string | null => {
    const r = parseRangeCode(code);
    if (r) return r.unit ? t("rangeUnit", { min: r.min, max: r.max, unit: t(`units.${r.unit}`) }) : t("range", { min: r.min, max: r.max });
    return typeof code === "string" && (SHARED_CODES as readonly string[]).includes(code) ? t(code as (typeof SHARED_CODES)[number]) : null;
  };
}
