// Simple line icons for the portal's bottom bar, drawn by the team.
type P = { className?: string };
const base = { viewBox: "0 0 24 24", fill: "none", stroke: "currentColor", strokeWidth: 2, strokeLinecap: "round" as const, strokeLinejoin: "round" as const, "aria-hidden": true, focusable: "false" as const };

export function SunIcon({ className = "h-7 w-7" }: P) {
  return (
    <svg {...base} className={className}>
      <circle cx="12" cy="12" r="4.5" />
      <path d="M12 2v2.5M12 19.5V22M2 12h2.5M19.5 12H22M4.9 4.9l1.8 1.8M17.3 17.3l1.8 1.8M4.9 19.1l1.8-1.8M17.3 6.7l1.8-1.8" />
    </svg>
  );
}
export function HeartChatIcon({ className = "h-7 w-7" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M4 5h16v11H9l-5 4Z" />
      <path d="M12 13.5s-3-1.8-3-3.8a1.6 1.6 0 0 1 3-.8 1.6 1.6 0 0 1 3 .8c0 2-3 3.8-3 3.8Z" />
    </svg>
  );
}
export function CupIcon({ className = "h-7 w-7" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M5 8h11v7a4 4 0 0 1-4 4H9a4 4 0 0 1-4-4Z" />
      <path d="M16 10h1.5a2.5 2.5 0 0 1 0 5H16M8 3.5v2M11 3v2.5M14 3.5v2" />
    </svg>
  );
}
export function MenuIcon({ className = "h-7 w-7" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M4 6h16M4 12h16M4 18h16" />
    </svg>
  );
}
export function LifebuoyIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <circle cx="12" cy="12" r="9" />
      <circle cx="12" cy="12" r="3.5" />
      <path d="m5.6 5.6 3.9 3.9M14.5 14.5l3.9 3.9M18.4 5.6l-3.9 3.9M9.5 14.5l-3.9 3.9" />
    </svg>
  );
}
export function PhoneIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M5 3h4l2 5-2.5 1.5a11 11 0 0 0 6 6L16 13l5 2v4a2 2 0 0 1-2 2A16 16 0 0 1 3 5a2 2 0 0 1 2-2Z" />
    </svg>
  );
}
export function BookIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M4 5a2 2 0 0 1 2-2h13v16H6a2 2 0 0 0-2 2Z" />
      <path d="M4 19a2 2 0 0 1 2-2h13" />
    </svg>
  );
}
export function PeopleIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <circle cx="9" cy="8" r="3.5" />
      <path d="M2.5 20a6.5 6.5 0 0 1 13 0" />
      <circle cx="17" cy="9" r="2.5" />
      <path d="M16 14.2a5 5 0 0 1 6 4.8" />
    </svg>
  );
}
export function TubeIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <rect x="8" y="2.5" width="8" height="19" rx="4" />
      <path d="M10.5 8h3M10.5 12h3M10.5 16h3" />
    </svg>
  );
}
export function GlobeIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <circle cx="12" cy="12" r="9" />
      <path d="M3 12h18M12 3c2.5 2.5 3.5 5.5 3.5 9s-1 6.5-3.5 9c-2.5-2.5-3.5-5.5-3.5-9S9.5 5.5 12 3Z" />
    </svg>
  );
}
export function ExitIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M14 4h5v16h-5M10 8l-4 4 4 4M6 12h10" />
    </svg>
  );
}
export function KeyIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <circle cx="8" cy="15" r="4" />
      <path d="M11 12l9-9M16 7l3 3M14 9l2 2" />
    </svg>
  );
}
export function BellIcon({ className = "h-6 w-6" }: P) {
  return (
    <svg {...base} className={className}>
      <path d="M6 16V11a6 6 0 0 1 12 0v5l2 2H4l2-2M10 20a2 2 0 0 0 4 0" />
    </svg>
  );
}
