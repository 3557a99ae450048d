"use client";
// A glossary word on a portal page: tap it to see its plain meaning right after it, tap again
// (or "Close") to hide it. An inline target in a sentence (WCAG 2.2, 2.5.8 inline exception).
import { useId, useState } from "react";

export function GlossaryTerm({ children, term, meaning, closeLabel }: { children: string; term: string; meaning: string; closeLabel: string }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  return (
    <>
      <button
        type="button"
        className="inline cursor-help rounded-sm font-[inherit] text-brand underline decoration-dotted decoration-2 underline-offset-4"
        aria-expanded={open}
        aria-controls={id}
        data-term={term}
        onClick={() => setOpen((o) => !o)}
      >
        {children}
      </button>
      {open ? (
        <span id={id} role="note" className="mx-1 inline rounded-md border-2 border-brand bg-brand-soft px-2 py-0.5 text-ink" data-testid="term-meaning">
          <strong>{term}:</strong> {meaning}{" "}
          <button type="button" className="font-bold text-brand underline underline-offset-4" data-term-close onClick={() => setOpen(false)}>
            {closeLabel}
          </button>
        </span>
      ) : null}
    </>
  );
}
