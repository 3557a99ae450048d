import type { TriageLevel } from "@/lib/clinical";

// Our own marks for the four levels; each level is also a word and a colour, never colour alone.
// Shapes differ so the level reads in greyscale and to people who cannot tell red from green.
type IconProps = { className?: string };

/** Emergency: a filled octagon "stop" mark with a white bar. */
export function EmergencyIcon({ className = "h-10 w-10" }: IconProps) {
  return (
    <svg viewBox="0 0 48 48" className={className} aria-hidden="true" focusable="false">
      <path d="M16 3h16l13 13v16L32 45H16L3 32V16Z" fill="currentColor" />
      <rect x="12" y="20.5" width="24" height="7" rx="2" fill="#fff" />
    </svg>
  );
}

/** Urgent today: a clock face whose centre holds an exclamation mark. */
export function UrgentIcon({ className = "h-10 w-10" }: IconProps) {
  return (
    <svg viewBox="0 0 48 48" className={className} aria-hidden="true" focusable="false">
      <circle cx="24" cy="24" r="20" fill="none" stroke="currentColor" strokeWidth="4" />
      <path d="M24 4v5M24 39v5M4 24h5M39 24h5" stroke="currentColor" strokeWidth="3" />
      <rect x="21.5" y="12" width="5" height="16" rx="2.5" fill="currentColor" />
      <circle cx="24" cy="34" r="3" fill="currentColor" />
    </svg>
  );
}

/** Soon: a calendar page with one day marked. */
export function SoonIcon({ className = "h-10 w-10" }: IconProps) {
  return (
    <svg viewBox="0 0 48 48" className={className} aria-hidden="true" focusable="false">
      <rect x="5" y="9" width="38" height="34" rx="4" fill="none" stroke="currentColor" strokeWidth="4" />
      <path d="M5 19h38" stroke="currentColor" strokeWidth="4" />
      <path d="M15 4v9M33 4v9" stroke="currentColor" strokeWidth="4" strokeLinecap="round" />
      <rect x="27" y="26" width="9" height="9" rx="1.5" fill="currentColor" />
    </svg>
  );
}

/** Self-care: a leaf with its vein. */
export function SelfCareIcon({ className = "h-10 w-10" }: IconProps) {
  return (
    <svg viewBox="0 0 48 48" className={className} aria-hidden="true" focusable="false">
      <path d="M8 40C8 20 20 7 42 6c0 22-12 35-32 34Z" fill="currentColor" />
      <path d="M10 38C18 28 26 20 34 14" stroke="#fff" strokeWidth="3" strokeLinecap="round" fill="none" />
    </svg>
  );
}

export const LEVEL_ICON: Record<TriageLevel, (p: IconProps) => React.JSX.Element> = {
  emergency: EmergencyIcon,
  urgent: UrgentIcon,
  soon: SoonIcon,
  "self-care": SelfCareIcon,
};

/** Tailwind classes for each level: a strong border and mark, a soft fill, dark text (AA contrast). */
export const LEVEL_STYLE: Record<TriageLevel, { box: string; mark: string; text: string; solid: string }> = {
  emergency: { box: "border-level-emergency bg-level-emergency-soft", mark: "text-level-emergency", text: "text-level-emergency-ink", solid: "bg-level-emergency text-white" },
  urgent: { box: "border-level-urgent bg-level-urgent-soft", mark: "text-level-urgent", text: "text-level-urgent-ink", solid: "bg-level-urgent text-white" },
  soon: { box: "border-level-soon bg-level-soon-soft", mark: "text-level-soon", text: "text-level-soon-ink", solid: "bg-level-soon text-white" },
  "self-care": { box: "border-level-selfcare bg-level-selfcare-soft", mark: "text-level-selfcare", text: "text-level-selfcare-ink", solid: "bg-level-selfcare text-white" },
};
