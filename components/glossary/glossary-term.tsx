"use client";
// A glossary word on a portal page: tap it to see its plain meaning right after it, tap again
// (or "Close") to hide it. An inline target in a sentence (WCAG 2.2, 2.5.8 inline exception).
import { useId, useState } from "react";
import { findTerms, type GlossaryEntry } from "@/lib/shared/glossary";

/** The glossary of a page's language (components/glossary/with-terms glossaryEntries). */
export type Glossary = { entries: GlossaryEntry[]; close: string };

/**
 * Text with its glossary words made tappable: the one way a portal text shows plain words (Learn,
 * check-in questions and results, Today, My catheter, Get help). Without a glossary, plain text.
 */
export function WithTerms({ text, glossary }: { text: string; glossary: Glossary | null | undefined }) {
  if (!glossary) return <>{text}</>;
  return (
    <>
      {findTerms(text, glossary.entries).map((s, i) => {
        const entry = s.key ? glossary.entries.find((e) => e.key === s.key) : undefined;
        return entry ? (
          <GlossaryTerm key={i} term={entry.term} meaning={entry.meaning} closeLabel={glossary.close}>
            {s.text}
          </GlossaryTerm>
        ) : (
          <span key={i}>{s.text}</span>
        );
      })}
    </>
  );
}

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
