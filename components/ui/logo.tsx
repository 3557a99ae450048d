// The Caddis mark: a small rounded tube case with three bands, drawn by the team.
export function LogoMark({ className = "h-8 w-8", title }: { className?: string; title?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} role={title ? "img" : undefined} aria-hidden={title ? undefined : true}>
      {title ? <title>{title}</title> : null}
      <rect x="9" y="3" width="14" height="26" rx="7" fill="#0b5563" />
      <rect x="12" y="6" width="8" height="20" rx="4" fill="#faf7f0" />
      <path d="M12 11h8M12 16h8M12 21h8" stroke="#0b5563" strokeWidth="2" />
    </svg>
  );
}

const wordmarkSizes = {
  sm: { mark: "h-7 w-7", text: "" },
  md: { mark: "h-8 w-8", text: "text-xl" },
  lg: { mark: "h-9 w-9", text: "text-2xl" },
} as const;

/** The mark and the name side by side, as every page header shows them. */
export function Wordmark({ size = "md", className = "" }: { size?: keyof typeof wordmarkSizes; className?: string }) {
  const s = wordmarkSizes[size];
  return (
    <span className={`flex items-center gap-2 font-bold text-brand ${s.text} ${className}`.trim()}>
      <LogoMark className={s.mark} />
      <span>Caddis</span>
    </span>
  );
}
