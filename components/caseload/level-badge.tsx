import { useTranslations } from "next-intl";
import { LEVEL_ICON, LEVEL_STYLE } from "@/components/ui/level-marks";
import type { TriageLevel } from "@/lib/clinical";

/** A check-in level for staff: word, mark and colour together (the patient's marks, smaller). */
export function LevelBadge({ level, className = "" }: { level: TriageLevel; className?: string }) {
  const v = useTranslations("Vocabulary");
  const Icon = LEVEL_ICON[level];
  const s = LEVEL_STYLE[level];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-bold ${s.box} ${s.text} ${className}`}>
      <span className={s.mark}>
        <Icon className="h-4 w-4" />
      </span>
      {v(`triageLevel.${level}`)}
    </span>
  );
}
