import type { ReactNode } from "react";

type Tone = "stop" | "warn" | "info" | "ok";

const tones: Record<Tone, string> = {
  stop: "border-finding-stop bg-finding-stop-soft",
  warn: "border-finding-warn bg-finding-warn-soft",
  info: "border-finding-info bg-finding-info-soft",
  ok: "border-level-selfcare bg-level-selfcare-soft",
};

/** A bordered message box; the words carry the meaning, the colour only repeats it. */
export function Notice({
  tone = "info",
  title,
  children,
  role,
  className = "",
  testId,
}: {
  tone?: Tone;
  title?: ReactNode;
  children?: ReactNode;
  role?: "alert" | "status";
  className?: string;
  testId?: string;
}) {
  return (
    <div role={role} className={`rounded-lg border-2 border-s-8 p-3 ${tones[tone]} ${className}`} data-testid={testId}>
      {title ? <p className="font-bold">{title}</p> : null}
      {children}
    </div>
  );
}

/** The one alert box: what went wrong with a form or an action, announced as it appears; nothing when there is no message. */
export function ErrorAlert({ message, children, testId = "form-error", className }: { message: ReactNode; children?: ReactNode; testId?: string; className?: string }) {
  if (!message) return null;
  return (
    <Notice tone="stop" role="alert" title={message} testId={testId} className={className}>
      {children}
    </Notice>
  );
}

/** The one success box: what a form or an action did. */
export function DoneStatus({ message, children, testId, className }: { message: ReactNode; children?: ReactNode; testId?: string; className?: string }) {
  if (!message) return null;
  return (
    <Notice tone="ok" role="status" title={message} testId={testId} className={className}>
      {children}
    </Notice>
  );
}
