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

function placeholders(text: string): string[] {
  return [...text.matchAll(/\{\s*([a-zA-Z0-9_]+)/g)].map((m) => m[1]).sort();
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
