import type { ReactNode } from "react";

type Tone = "stop" | "warn" | "info" | "ok";

const tones: Record<Tone, string> = {
  stop: "border-finding-stop bg-finding-stop-soft",
  warn: "border-finding-warn bg-finding-warn-soft",
  info: "border-finding-info bg-finding-info-soft",
  ok: "border-level-selfcare bg-level-selfcare-soft",
};

/** A bordered message box; the words carry the meaning, the colour only repeats it. */
export function Notice({ tone = "info", title, children, role }: { tone?: Tone; title?: ReactNode; children?: ReactNode; role?: "alert" | "status" }) {
  return (
    <div role={role} className={`rounded-lg border-2 border-s-8 p-3 ${tones[tone]}`}>
      {title ? <p className="font-bold">{title}</p> : null}
      {children}
    </div>
  );
}
