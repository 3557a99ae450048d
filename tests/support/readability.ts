// Flesch–Kincaid grade of plain-language text, counted by us and scored with the
// `flesch-kincaid` package (the exact formula) and `syllable` for word syllables.
// Both packages leave sentence splitting to the caller and count digits as 0 syllables,
// so sentences are split here and numbers are counted as they are read aloud.
import { fleschKincaid } from "flesch-kincaid";
import { syllable } from "syllable";

/** Words the syllable package miscounts, or that are read as something else. */
export const SYLLABLE_OVERRIDES: Record<string, number> = {
  ptfe: 4, // "P T F E"
  ml: 4, // read "millilitres"
  kg: 3, // "kilograms"
  "e-mail": 2,
  ok: 2,
};

const ONES = ["zero", "one", "two", "three", "four", "five", "six", "seven", "eight", "nine", "ten", "eleven", "twelve", "thirteen", "fourteen", "fifteen", "sixteen", "seventeen", "eighteen", "nineteen"];
const TENS = ["", "", "twenty", "thirty", "forty", "fifty", "sixty", "seventy", "eighty", "ninety"];

/** A whole number as English words (0–9999), for counting syllables. */
export function numberWords(n: number): string {
  if (n < 20) return ONES[n];
  if (n < 100) return `${TENS[Math.floor(n / 10)]}${n % 10 ? ` ${ONES[n % 10]}` : ""}`;
  if (n < 1000) return `${ONES[Math.floor(n / 100)]} hundred${n % 100 ? ` and ${numberWords(n % 100)}` : ""}`;
  return `${numberWords(Math.floor(n / 1000))} thousand${n % 1000 ? ` ${numberWords(n % 1000)}` : ""}`;
}

export function wordSyllables(raw: string): number {
  const w = raw.toLowerCase().replace(/^[^a-z0-9°]+|[^a-z0-9°]+$/g, "");
  if (!w) return 0;
  if (w in SYLLABLE_OVERRIDES) return SYLLABLE_OVERRIDES[w];
  const num = /^(\d+)(?:\.(\d+))?$/.exec(w);
  if (num) {
    const words = [numberWords(Number(num[1])), ...(num[2] ? ["point", ...num[2].split("").map((d) => ONES[Number(d)])] : [])].join(" ");
    return words.split(/\s+/).reduce((s, x) => s + syllable(x), 0);
  }
  return Math.max(1, syllable(w));
}

/** Sentences: ended by . ! ? or : followed by a space or the end; a heading or list item without a stop is one sentence. */
export function splitSentences(block: string): string[] {
  return block
    .split(/(?<=[.!?:])\s+/)
    .map((s) => s.trim())
    .filter((s) => /[A-Za-z0-9]/.test(s));
}

export function words(sentence: string): string[] {
  // "1.5" stays one word; "to 2" two words; dashes between words split them.
  return sentence
    .replace(/[–—]/g, " ")
    .split(/\s+/)
    .filter((w) => /[A-Za-z0-9]/.test(w));
}

export function counts(blocks: string[]) {
  const sentences = blocks.flatMap(splitSentences);
  const ws = sentences.flatMap(words);
  return { sentence: sentences.length, word: ws.length, syllable: ws.reduce((s, w) => s + wordSyllables(w), 0) };
}

export function grade(blocks: string[]): number {
  return fleschKincaid(counts(blocks));
}
