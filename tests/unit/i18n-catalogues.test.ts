import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { locales } from "@/lib/i18n/routing";

const dir = path.resolve(__dirname, "../../messages");
const load = (l: string) => JSON.parse(fs.readFileSync(path.join(dir, `${l}.json`), "utf8"));

function keys(obj: unknown, prefix = ""): string[] {
  if (typeof obj !== "object" || obj === null) return [prefix];
  return Object.entries(obj).flatMap(([k, v]) => keys(v, prefix ? `${prefix}.${k}` : k));
}

/** Argument names of an ICU message, including those nested in plural/select branches. */
function args(text: string): Set<string> {
  const out = new Set<string>();
  let i = 0;
  while (i < text.length) {
    if (text[i] !== "{") {
      i++;
      continue;
    }
    let depth = 0;
    let j = i;
    for (; j < text.length; j++) {
      if (text[j] === "{") depth++;
      else if (text[j] === "}" && --depth === 0) break;
    }
    const inner = text.slice(i + 1, j);
    const [name, type] = inner.split(",", 2).map((s) => s.trim());
    out.add(name);
    if (type === "plural" || type === "select" || type === "selectordinal") {
      const branches = inner.slice(inner.indexOf(",", inner.indexOf(",") + 1) + 1);
      for (const b of branches.match(/\{[^{}]*(?:\{[^{}]*\}[^{}]*)*\}/g) ?? []) {
        for (const n of args(b.slice(1, -1))) out.add(n);
      }
    }
    i = j + 1;
  }
  return out;
}

function placeholders(text: string): string[] {
  return [...args(text)].sort();
}

const en = load("en");
const enKeys = keys(en);

function get(obj: Record<string, unknown>, key: string): unknown {
  return key.split(".").reduce<unknown>((o, k) => (o as Record<string, unknown>)?.[k], obj);
}

describe("message catalogues", () => {
  it("has a catalogue file for every locale and no stray ones", () => {
    const files = fs.readdirSync(dir).filter((f) => f.endsWith(".json")).map((f) => f.replace(/\.json$/, ""));
    expect(files.sort()).toEqual([...locales].sort());
  });

  for (const locale of locales.filter((l) => l !== "en")) {
    it(`${locale} has every key that en has, and no others`, () => {
      const other = keys(load(locale));
      expect(enKeys.filter((k) => !other.includes(k)), `missing in ${locale}`).toEqual([]);
      expect(other.filter((k) => !enKeys.includes(k)), `extra in ${locale}`).toEqual([]);
    });

    it(`${locale} keeps every placeholder of en`, () => {
      const catalogue = load(locale);
      const wrong = enKeys.filter((k) => {
        const a = get(en, k);
        const b = get(catalogue, k);
        return typeof a === "string" && typeof b === "string" && placeholders(a).join() !== placeholders(b).join();
      });
      expect(wrong).toEqual([]);
    });
  }
});
