import { useTranslations } from "next-intl";
import type { TriageLevel } from "@/lib/clinical";
import { LEVEL_ICON, LEVEL_STYLE } from "@/components/ui/level-marks";

/** A level as word + shape + colour together (never colour alone). */
export function LevelBadge({ level, size = "large", as: Tag = "p" }: { level: TriageLevel; size?: "large" | "small"; as?: "p" | "h2" | "h1" }) {
  const t = useTranslations("CheckIn.level");
  const Icon = LEVEL_ICON[level];
  const s = LEVEL_STYLE[level];
  return (
    <Tag
      className={`flex flex-wrap items-center gap-3 rounded-card border-4 ${s.box} ${s.text} ${size === "large" ? "p-4 text-2xl" : "p-2 text-lg"} font-bold`}
      data-level={level}
    >
      <span className={`shrink-0 ${s.mark}`}>
        <Icon className={size === "large" ? "h-12 w-12 shrink-0" : "h-8 w-8 shrink-0"} />
      </span>
      <span>{t(level)}</span>
    </Tag>
  );
}
