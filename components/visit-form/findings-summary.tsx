"use client";
// A structured visit's findings in one line each, for the History timeline.
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { visitFindingsSchema } from "@/lib/validations/visit";

export function FindingsSummary({ findings }: { findings: unknown }) {
  const t = useTranslations("Visits.findings");
  const format = useFormat();
  // Stored as validated; read back loosely (a past next-visit date is still worth showing).
  const parsed = visitFindingsSchema.safeParse({ ...(findings as object), nextVisitOn: undefined });
  if (!parsed.success) return null;
  const f = parsed.data;
  const next = (findings as { nextVisitOn?: unknown }).nextVisitOn;
  const yesNo = (b: boolean) => (b ? t("yes") : t("no"));
  const done = [f.bagChanged && t("bagChanged"), f.valveChanged && t("valveChanged"), f.catheterChanged && t("catheterChanged"), f.sampleSent && t("sampleSent")].filter(Boolean);
  return (
    <ul className="mt-1 flex flex-wrap gap-x-4 text-sm" data-testid="visit-findings">
      <li>{t("summary.draining", { value: yesNo(f.draining) })}</li>
      <li>{t("summary.bypassing", { value: yesNo(f.bypassing) })}</li>
      <li>{t("summary.urine", { value: f.urine.map((u) => t(`urineValues.${u}`)).join(", ") })}</li>
      <li>{t("summary.site", { value: t(`siteValues.${f.site}`) })}</li>
      {done.length ? <li className="font-bold">{done.join(" · ")}</li> : null}
      {typeof next === "string" && /^\d{4}-\d{2}-\d{2}$/.test(next) ? (
        <li>{t("summary.next", { date: format.dateTime(new Date(`${next}T12:00:00Z`), { dateStyle: "medium", timeZone: "UTC" }) })}</li>
      ) : null}
      {f.advice ? <li className="basis-full">{t("summary.advice", { advice: f.advice })}</li> : null}
    </ul>
  );
}
