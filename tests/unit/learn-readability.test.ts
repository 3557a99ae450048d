// Every English guidance page reads at Flesch–Kincaid grade 6 or below (Caddis's target for
// patient pages, docs/design.md: below the Patient Information Forum's reading age of 9–11 and the
// 6th–8th grade US health-literacy bodies advise), and every page of every locale is complete.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { locales } from "@/lib/i18n/routing";
import { LEARN_PAGES, type LearnSection } from "@/lib/shared/learn";
import { counts, grade, numberWords, splitSentences, wordSyllables } from "../support/readability";

const load = (l: string) => JSON.parse(fs.readFileSync(path.resolve(__dirname, `../../messages/${l}.json`), "utf8"));
type Page = { title: string; summary: string; sections: LearnSection[] };
const pageBlocks = (p: Page) => [p.title, p.summary, ...p.sections.flatMap((s) => [s.heading, ...s.points])];

describe("readability measure", () => {
  // Source: Kincaid et al., Derivation of New Readability Formulas for Navy Enlisted Personnel
  // (1975), the grade formula 0.39 × words/sentence + 11.8 × syllables/word − 15.59: 38 words,
  // 5 sentences and 44 syllables give 1.04 by hand. (Our own sample text with those counts.)
  const sample =
    "Wash your hands with water. Keep the bag lower on your leg. Drink a glass of water now and then. Tell the nurses if it itches. Call us when the tube is blocked or the bag stays empty.";

  it("counts the known-easy sample as 5 sentences, 38 words, 44 syllables and scores it 1.04", () => {
    expect(counts([sample])).toEqual({ sentence: 5, word: 38, syllable: 44 });
    expect(grade([sample]).toFixed(2)).toBe("1.04");
  });

  it("splits sentences itself (the packages do not) and counts numbers as spoken", () => {
    expect(splitSentences("Drink 1.5 to 2 litres. Then rest! Done")).toEqual(["Drink 1.5 to 2 litres.", "Then rest!", "Done"]);
    expect(numberWords(18)).toBe("eighteen");
    expect(wordSyllables("1.5")).toBe(3); // one point five
    expect(wordSyllables("18")).toBe(2);
    expect(wordSyllables("catheter")).toBe(3);
    expect(wordSyllables("ml")).toBe(4); // millilitres
  });
});

describe("Learn pages", () => {
  const en = load("en").Learn;

  it("has all ten topics", () => {
    expect(LEARN_PAGES).toHaveLength(10);
    for (const p of LEARN_PAGES) expect(en.pages[p.key], p.key).toBeDefined();
  });

  it.each(LEARN_PAGES.map((p) => [p.key]))("English page %s scores Flesch–Kincaid grade ≤ 6", (key) => {
    const g = grade(pageBlocks(en.pages[key]));
    expect(g, `${key}: grade ${g.toFixed(2)}`).toBeLessThanOrEqual(6);
  });

  it.each([...locales])("%s: every page has a title, summary and the same sections as English", (locale) => {
    const pages = load(locale).Learn.pages;
    for (const p of LEARN_PAGES) {
      const page: Page = pages[p.key];
      expect(page.title.length, `${locale} ${p.key}`).toBeGreaterThan(0);
      expect(page.sections.map((s) => s.points.length)).toEqual(en.pages[p.key].sections.map((s: LearnSection) => s.points.length));
    }
    // The foot of every translated patient page says whether a medical translator reviewed it.
    expect(load(locale).TranslationReview.notReviewedFooter.length).toBeGreaterThan(20);
  });
});

describe("check-in questions and results", () => {
  const ci = load("en").CheckIn as {
    questions: Record<string, { self: string; carer: string; hint?: string; options?: Record<string, string> }>;
    reason: Record<string, string>;
    advice: Record<string, string>;
  };

  it.each(Object.keys(ci.questions).map((k) => [k]))("English question %s (with its hint and answers) scores grade ≤ 6", (key) => {
    const q = ci.questions[key];
    for (const who of [q.self, q.carer]) {
      const g = grade([who, ...(q.hint ? [q.hint] : []), ...Object.values(q.options ?? {})]);
      expect(g, `${key}: grade ${g.toFixed(2)}`).toBeLessThanOrEqual(6);
    }
  });

  it("the results' reasons and advice, read together as a result shows them, score grade ≤ 6", () => {
    const reasons = grade(Object.values(ci.reason));
    const advice = grade(Object.values(ci.advice));
    expect(reasons, `reasons: grade ${reasons.toFixed(2)}`).toBeLessThanOrEqual(6);
    expect(advice, `advice: grade ${advice.toFixed(2)}`).toBeLessThanOrEqual(6);
  });
});
