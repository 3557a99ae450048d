import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";

type Group = "route" | "catheterType" | "material" | "lengthCategory" | "gelKind" | "unplannedReason" | "removalReason" | "twocOutcome" | "failedAction" | "twocSymptom";

/** The choices of one enum with their labels (Vocabulary), for a select or a radio group. */
export function useEpisodeOptions() {
  const t = useTranslations("Vocabulary");
  return <T extends string>(values: readonly T[], group: Group) => values.map((v) => ({ value: v, label: t(`${group}.${v}` as "route.urethral") }));
}

/** The catheter in place in a sentence's words: size, balloon, material and when it went in. */
export function useDeviceSummary() {
  const t = useTranslations("Vocabulary");
  const format = useFormat();
  return (d: { sizeCh: number; balloonMl: number; material: string; insertedAt: string }) => ({
    size: d.sizeCh,
    balloon: d.balloonMl,
    material: t(`material.${d.material as "latex"}`),
    date: format.dateTime(new Date(d.insertedAt), { dateStyle: "medium" }),
  });
}
