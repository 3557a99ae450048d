// Plain words: the terms a patient meets (Ch, balloon, bypassing, TWOC, valve, leg bag, night
// bag, dipstick, suprapubic, urethral), explained in every language (messages: Glossary.terms),
// and found in a page's text so they can be tapped for their meaning.
export const GLOSSARY_KEYS = ["ch", "balloon", "bypassing", "twoc", "valve", "legBag", "nightBag", "dipstick", "suprapubic", "urethral"] as const;
export type GlossaryKey = (typeof GLOSSARY_KEYS)[number];
export type GlossaryEntry = { key: GlossaryKey; term: string; meaning: string; find: string };

export type Segment = { text: string; key?: GlossaryKey };

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/**
 * The text cut where glossary terms are (each `find` form, "a|b", matched from the start of a
 * word to its end, so "balloons" and Polish "balonik" count). "Ch" is matched as written (it is
 * a unit after a number); everything else ignores case. Arabic script words take prefixes (ال،
 * بال…), so there a form may start inside a word: the whole word is taken, prefix and all, so its
 * letters stay joined (a word split across two elements loses its joins).
 */
export function findTerms(text: string, entries: GlossaryEntry[]): Segment[] {
  const forms = entries
    .flatMap((e) => e.find.split("|").filter(Boolean).map((f) => ({ key: e.key, form: f })))
    .sort((a, b) => b.form.length - a.form.length);
  if (!forms.length) return [{ text }];
  const arabicScript = (s: string) => /[\u0600-\u06FF]/.test(s);
  const pattern = forms
    .map(({ form }) => {
      const body = escape(form);
      return form === "Ch" ? `(?<![\\p{L}\\p{N}])Ch(?![\\p{L}])` : arabicScript(form) ? `[\\p{L}\\p{M}]*${body}[\\p{L}\\p{M}]*` : `(?<![\\p{L}])${body}[\\p{L}\\p{M}]*`;
    })
    .join("|");
  const re = new RegExp(pattern, "giu");
  const out: Segment[] = [];
  let last = 0;
  for (const m of text.matchAll(re)) {
    const found = m[0];
    if (found === "ch" || found === "CH") continue; // only the unit "Ch"
    const lower = found.toLowerCase();
    const hit = forms.find((f) => (f.form === "Ch" ? found === "Ch" : lower.startsWith(f.form.toLowerCase()) || found.includes(f.form)));
    if (!hit) continue;
    if (m.index! > last) out.push({ text: text.slice(last, m.index) });
    out.push({ text: found, key: hit.key });
    last = m.index! + found.length;
  }
  if (last < text.length) out.push({ text: text.slice(last) });
  return out;
}
