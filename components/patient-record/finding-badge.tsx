import { useTranslations } from "next-intl";

export type FindingSeverity = "stop" | "warn" | "info";

const styles: Record<FindingSeverity, string> = {
  stop: "border-finding-stop bg-finding-stop-soft text-level-emergency-ink",
  warn: "border-finding-warn bg-finding-warn-soft text-level-urgent-ink",
  info: "border-finding-info bg-finding-info-soft text-level-soon-ink",
};

/** A device-check severity: word, shape and colour together. */
export function FindingBadge({ severity }: { severity: FindingSeverity }) {
  const t = useTranslations("FindingBadge");
  return (
    <span className={`inline-flex shrink-0 items-center gap-1.5 rounded-md border px-2 py-0.5 text-sm font-bold ${styles[severity]}`}>
      <svg viewBox="0 0 16 16" className="h-4 w-4" aria-hidden="true">
        {severity === "stop" ? (
          <>
            <path d="M5 1h6l4 4v6l-4 4H5l-4-4V5z" fill="currentColor" />
            <path d="M5 8h6" stroke="white" strokeWidth="2" strokeLinecap="round" />
          </>
        ) : severity === "warn" ? (
          <>
            <path d="M8 1.5 15 14.5H1z" fill="currentColor" />
            <path d="M8 6v4" stroke="white" strokeWidth="1.8" strokeLinecap="round" />
          </>
        ) : (
          <>
            <circle cx="8" cy="8" r="7" fill="currentColor" />
            <path d="M8 7v5" stroke="white" strokeWidth="1.8" strokeLinecap="round" />
            <circle cx="8" cy="4.5" r="1" fill="white" />
          </>
        )}
      </svg>
      {t(severity)}
    </span>
  );
}
