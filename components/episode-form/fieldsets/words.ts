import { useFormatter, useTranslations } from "next-intl";

type Group = "route" | "catheterType" | "material" | "lengthCategory" | "gelKind" | "unplannedReason" | "removalReason" | "failedAction";

/** The choices of one enum with their EpisodeForm labels, for a select or a radio group. */
export function useEpisodeOptions() {
  const t = useTranslations("EpisodeForm");
  return <T extends string>(values: readonly T[], group: Group) => values.map((v) => ({ value: v, label: t(`option.${group}.${v}` as "option.route.urethral") }));
}

/** The catheter in place in a sentence's words: size, balloon, material and when it went in. */
export function useDeviceSummary() {
  const t = useTranslations("EpisodeForm");
  const format = useFormatter();
  return (d: { sizeCh: number; balloonMl: number; material: string; insertedAt: string }) => ({
    size: d.sizeCh,
    balloon: d.balloonMl,
    material: t(`option.material.${d.material as "latex"}`),
    date: format.dateTime(new Date(d.insertedAt), { dateStyle: "medium" }),
  });
}
