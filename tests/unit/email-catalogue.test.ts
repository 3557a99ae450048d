// Every e-mail, Letters and Supplies message parses and formats in every locale (a broken ICU
// plural would otherwise surface only when that e-mail is sent).
import fs from "node:fs";
import path from "node:path";
import { createTranslator } from "next-intl";
import { describe, expect, it } from "vitest";
import { locales } from "@/lib/i18n/routing";

const dir = path.resolve(__dirname, "../../messages");
const numeric = new Set(["days", "count", "spares", "ch", "ml", "mm", "page", "pages", "overdue", "due", "quantity", "computed", "score"]);

function leaves(obj: unknown, prefix = ""): string[] {
  if (typeof obj !== "object" || obj === null) return [prefix];
  return Object.entries(obj).flatMap(([k, v]) => leaves(v, prefix ? `${prefix}.${k}` : k));
}

describe("e-mail catalogues format in every locale", () => {
  for (const locale of locales) {
    it(`${locale}: Email, AdminEmail, Letters and Supplies`, () => {
      const messages = JSON.parse(fs.readFileSync(path.join(dir, `${locale}.json`), "utf8"));
      const errors: string[] = [];
      const t = createTranslator({ locale, messages, onError: (e) => errors.push(e.message) });
      for (const ns of ["Email", "AdminEmail", "Letters", "Supplies"]) {
        for (const key of leaves(messages[ns], ns)) {
          const text: string = key.split(".").reduce((o, k) => o[k], messages);
          const names = [...text.matchAll(/\{\s*([A-Za-z]+)/g)].map((m) => m[1]);
          const values = Object.fromEntries(names.map((n) => [n, numeric.has(n) ? 3 : "X"]));
          for (const n of [0, 1, 2, 5, 11, 21]) {
            const out = (t as unknown as (k: string, v: Record<string, unknown>) => string)(key, { ...values, ...Object.fromEntries([...numeric].filter((k) => k in values).map((k) => [k, n])) });
            if (!out || out === key) errors.push(`${key}: empty`);
          }
        }
      }
      expect(errors).toEqual([]);
    });
  }
});
