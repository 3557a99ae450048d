import { useTranslations } from "next-intl";

type Group = "route" | "catheterType" | "material" | "lengthCategory" | "gelKind" | "unplannedReason" | "removalReason" | "failedAction";

/** The choices of one enum with their EpisodeForm labels, for a select or a radio group. */
export function useEpisodeOptions() {
  const t = useTranslations("EpisodeForm");
  return <T extends string>(values: readonly T[], group: Group) => values.map((v) => ({ value: v, label: t(`option.${group}.${v}` as "option.route.urethral") }));
}
