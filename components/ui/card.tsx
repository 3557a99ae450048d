import type { HTMLAttributes } from "react";

export function Card({ className = "", ...props }: HTMLAttributes<HTMLDivElement>) {
  return <div className={`rounded-card border border-stone-faint bg-paper-raised p-5 shadow-sm ${className}`} {...props} />;
}
