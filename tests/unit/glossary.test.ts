// Plain words: every language explains every term in plain words, and the terms are found in
// the patient texts so they can be tapped (English meanings at reading grade ≤ 6).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { locales } from "@/lib/i18n/routing";
import { GLOSSARY_KEYS, findTerms, type GlossaryEntry } from "@/lib/shared/glossary";
import { LEARN_PAGES, type LearnSection } from "@/lib/shared/learn";
import { grade } from "../support/readability";

const load = (l: string) => JSON.parse(fs.readFileSync(path.resolve(__dirname, `../../messages/${l}.json`), "utf8"));
const entries = (l: string): GlossaryEntry[] => GLOSSARY_KEYS.map((key) => ({ key, ...load(l).Glossary.terms[key] }));
const learnText = (l: string) =>
  LEARN_PAGES.flatMap((p) => {
    const page = load(l).Learn.pages[p.key];
    return [page.summary, ...page.sections.flatMap((s: LearnSection) => s.points)];
  }).join("\n");

describe("plain words", () => {
  it.each([...locales])("%s: every term has a name, a meaning and words to find it by", (l) => {
    for (const e of entries(l)) {
      expect(e.term.length, `${l} ${e.key}`).toBeGreaterThan(1);
      expect(e.meaning.length, `${l} ${e.key}`).toBeGreaterThan(20);
      expect(e.find.split("|").filter(Boolean).length, `${l} ${e.key}`).toBeGreaterThan(0);
    }
  });

  it("English meanings read at grade 6 or below", () => {
    for (const e of entries("en")) expect(grade([e.meaning]), e.key).toBeLessThanOrEqual(6);
  });

  it("finds terms in a sentence, whole words only, the unit Ch as written", () => {
    const en = entries("en");
    const marked = (text: string) => findTerms(text, en).filter((s) => s.key).map((s) => `${s.key}:${s.text}`);
    expect(marked("Keep the leg bag below your bladder. The balloons hold it.")).toEqual(["legBag:leg bag", "balloon:balloons"]);
    expect(marked("Size 14 Ch. A child checks each chair.")).toEqual(["ch:Ch"]);
    expect(findTerms("No terms here.", en)).toEqual([{ text: "No terms here." }]);
    expect(findTerms("Open the valve.", en).map((s) => s.text).join("")).toBe("Open the valve.");
  });

  it("an Arabic-script term with a prefix is tapped as the whole word, so its letters stay joined", () => {
    const ar = entries("ar");
    // "the balloon": the article is part of the word; split off it would stand unjoined.
    expect(findTerms("البالون", ar)).toEqual([{ text: "البالون", key: "balloon" }]);
    expect(findTerms("املأ البالون بالماء.", ar).map((s) => s.text)).toEqual(["املأ ", "البالون", " بالماء."]);
  });

  it.each(["en", "pl", "ar", "ur"])("%s: the Learn pages hold terms to tap (leg bag, night bag, valve at least)", (l) => {
    const found = new Set(findTerms(learnText(l), entries(l)).flatMap((s) => (s.key ? [s.key] : [])));
    for (const key of ["legBag", "nightBag", "valve"] as const) expect(found, `${l} ${key}`).toContain(key);
  });
});
