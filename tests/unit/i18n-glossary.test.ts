// One term per concept per language (tests/support/glossary.ts): each catalogue uses the agreed
// word for the catheter, its gels and allergens, and never another spelling or synonym beside it.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { locales } from "@/lib/i18n/routing";
import { glossary } from "../support/glossary";

type Tree = { [key: string]: string | Tree };
const strings = (tree: Tree, prefix = ""): [string, string][] =>
  Object.entries(tree).flatMap(([k, v]) => (typeof v === "string" ? [[`${prefix}${k}`, v] as [string, string]] : strings(v, `${prefix}${k}.`)));

describe("one term per concept per language", () => {
  it("has a glossary for every locale", () => {
    expect(Object.keys(glossary).sort()).toEqual([...locales].sort());
  });

  for (const locale of locales) {
    const catalogue = strings(JSON.parse(fs.readFileSync(path.resolve(__dirname, `../../messages/${locale}.json`), "utf8")) as Tree);
    for (const term of glossary[locale] ?? []) {
      it(`${locale}: "${term.concept}" is always "${term.use}"`, () => {
        const lower = (s: string) => s.toLocaleLowerCase(locale);
        expect(catalogue.some(([, text]) => lower(text).includes(lower(term.use))), `"${term.use}" is used`).toBe(true);
        const others = catalogue.filter(([, text]) => term.notAlso.some((word) => lower(text).includes(lower(word)))).map(([key, text]) => `${key}: ${text}`);
        expect(others).toEqual([]);
      });
    }
  }
});
