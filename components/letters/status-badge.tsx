import type { ReactNode } from "react";
import type { OutboundMessageDto } from "@/lib/shared/dto";

type Status = OutboundMessageDto["status"];

// A word, an icon shape and a colour: never colour alone.
const look: Record<Status, { box: string; icon: ReactNode }> = {
  sent: {
    box: "border-level-selfcare bg-level-selfcare-soft text-level-selfcare-ink",
    icon: <path d="M5 12.5l4.5 4.5L19 7.5" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinecap="round" strokeLinejoin="round" />,
  },
  queued: {
    box: "border-level-soon bg-level-soon-soft text-level-soon-ink",
    icon: (
      <>
        <circle cx="12" cy="12" r="8" fill="none" stroke="currentColor" strokeWidth="2.2" />
        <path d="M12 7.5V12l3 2" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" />
      </>
    ),
  },
  sending: {
    box: "border-level-soon bg-level-soon-soft text-level-soon-ink",
    icon: <path d="M4 12h12M12 6l6 6-6 6" fill="none" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round" strokeLinejoin="round" />,
  },
  failed: {
    box: "border-level-emergency bg-level-emergency-soft text-level-emergency-ink",
    icon: (
      <>
        <path d="M12 3.5L21 19.5H3z" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinejoin="round" />
        <path d="M12 9.5v4.5M12 16.8v.2" stroke="currentColor" strokeWidth="2.4" strokeLinecap="round" />
      </>
    ),
  },
};

export function StatusBadge({ status, label }: { status: Status; label: string }) {
  const l = look[status];
  return (
    <span className={`inline-flex items-center gap-1.5 rounded-full border-2 px-3 py-1 text-sm font-bold ${l.box}`}>
      <svg viewBox="0 0 24 24" className="h-4 w-4 shrink-0" aria-hidden="true">
        {l.icon}
      </svg>
      {label}
    </span>
  );
}
