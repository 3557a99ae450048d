import { useTranslations } from "next-intl";

export type CaseloadState = "ok" | "due-soon" | "overdue";

const styles: Record<CaseloadState, string> = {
  overdue: "border-finding-stop bg-finding-stop-soft text-level-emergency-ink",
  "due-soon": "border-finding-warn bg-finding-warn-soft text-level-urgent-ink",
  ok: "border-level-selfcare bg-level-selfcare-soft text-level-selfcare-ink",
};

export function StateIcon({ state, className = "h-4 w-4" }: { state: CaseloadState; className?: string }) {
  const common = { className, viewBox: "0 0 16 16", "aria-hidden": true as const, focusable: "false" as const };
  if (state === "overdue") {
    // A filled triangle with an exclamation: the date has passed.
    return (
      <svg {...common}>
        <path d="M8 1.5 15 14.5H1z" fill="currentColor" />
        <path d="M8 6v4" stroke="white" strokeWidth="1.8" strokeLinecap="round" />
        <circle cx="8" cy="12.3" r="1" fill="white" />
      </svg>
    );
  }
  if (state === "due-soon") {
    // An hourglass: the date is close.
    return (
      <svg {...common}>
        <path d="M3.5 1.5h9M3.5 14.5h9M4.5 1.5c0 4 7 4.5 7 6.5s-7 2.5-7 6.5M11.5 1.5c0 4-7 4.5-7 6.5s7 2.5 7 6.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
      </svg>
    );
  }
  // A tick in a circle: nothing due within the week.
  return (
    <svg {...common}>
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="1.6" />
      <path d="m5 8.2 2 2 4-4.4" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

/** A caseload state (from lib/clinical planDates' rule): word, icon and colour together. */
export function StateBadge({ state, className = "" }: { state: CaseloadState; className?: string }) {
  const t = useTranslations("CaseloadState");
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2.5 py-0.5 text-sm font-bold ${styles[state]} ${className}`}>
      <StateIcon state={state} />
      {t(state)}
    </span>
  );
}
