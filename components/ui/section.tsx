import type { ReactNode } from "react";

/** A group of fields under a heading; two columns from small screens up unless `columns` is 1. */
export function Section({ title, hint, columns = 2, className = "", children }: { title: ReactNode; hint?: ReactNode; columns?: 1 | 2; className?: string; children: ReactNode }) {
  return (
    <section className={`rounded-card border border-stone-faint bg-paper-raised p-4 md:p-5 ${className}`}>
      <h2 className="mb-4 text-xl font-bold text-brand">{title}</h2>
      {hint ? <p className="-mt-2 mb-4 text-sm text-ink-soft">{hint}</p> : null}
      <div className={`grid gap-4 ${columns === 2 ? "sm:grid-cols-2" : ""}`}>{children}</div>
    </section>
  );
}
