/** The drawn warning triangle beside an allergy warning (with words: never colour alone). */
export function WarningMark({ className = "h-6 w-6 shrink-0" }: { className?: string }) {
  return (
    <svg viewBox="0 0 16 16" className={className} aria-hidden="true">
      <path d="M8 1.5 15 14.5H1z" fill="currentColor" />
      <path d="M8 6v4" stroke="white" strokeWidth="1.8" strokeLinecap="round" />
      <circle cx="8" cy="12.3" r="1" fill="white" />
    </svg>
  );
}
