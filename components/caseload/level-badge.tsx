import { useTranslations } from "next-intl";
import type { TriageLevel } from "@/lib/clinical";

export type Level = TriageLevel;

const styles: Record<Level, string> = {
  emergency: "border-level-emergency bg-level-emergency-soft text-level-emergency-ink",
  urgent: "border-level-urgent bg-level-urgent-soft text-level-urgent-ink",
  soon: "border-level-soon bg-level-soon-soft text-level-soon-ink",
  "self-care": "border-level-selfcare bg-level-selfcare-soft text-level-selfcare-ink",
};

/** The shape of each level, so it never rests on colour alone (WCAG 2.2 1.4.1 Use of Color; docs/design.md). */
export function LevelIcon({ level, className = "h-4 w-4" }: { level: Level; className?: string }) {
  const common = { className, viewBox: "0 0 16 16", "aria-hidden": true as const, focusable: "false" as const };
  switch (level) {
    case "emergency":
      // A filled eight-sided stop mark.
      return (
        <svg {...common}>
          <path d="M5 1h6l4 4v6l-4 4H5l-4-4V5z" fill="currentColor" />
          <path d="M8 4v5" stroke="white" strokeWidth="2" strokeLinecap="round" />
          <circle cx="8" cy="12" r="1.2" fill="white" />
        </svg>
      );
    case "urgent":
      // A clock with an exclamation beside it.
      return (
        <svg {...common}>
          <circle cx="6.5" cy="8.5" r="5.5" fill="none" stroke="currentColor" strokeWidth="1.8" />
          <path d="M6.5 5.5v3.2l2 1.3" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
          <path d="M14 2v7" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
          <circle cx="14" cy="12.5" r="1.2" fill="currentColor" />
        </svg>
      );
    case "soon":
      // A calendar page.
      return (
        <svg {...common}>
          <rect x="1.5" y="3" width="13" height="11.5" rx="1.5" fill="none" stroke="currentColor" strokeWidth="1.6" />
          <path d="M1.5 6.5h13M5 1.5v3M11 1.5v3" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
          <rect x="4" y="9" width="3" height="3" fill="currentColor" />
        </svg>
      );
    case "self-care":
      // A leaf.
      return (
        <svg {...common}>
          <path d="M2 14C2 6 7 2 14 2c0 7-4 12-12 12z" fill="currentColor" />
          <path d="M3 13 10 6" stroke="white" strokeWidth="1.3" strokeLinecap="round" />
        </svg>
      );
  }
}

/** A check-in level: word, icon and colour together. */
export function LevelBadge({ level, className = "" }: { level: Level; className?: string }) {
  const t = useTranslations("LevelBadge");
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-bold ${styles[level]} ${className}`}>
      <LevelIcon level={level} />
      {t(level)}
    </span>
  );
}
