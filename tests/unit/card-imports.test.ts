// The public device card's route loads only what a scan needs: not the booklet PDF, object
// storage or passport issuing. With them its first scan after a start took about a second, not 0.2 s.
import { relative } from "node:path";
import { describe, expect, it } from "vitest";
import { repoRoot, resolveImport, sourceText } from "../support/source-files";

/** Every module the file loads when it is loaded: static imports and re-exports, not types, not import(). */
function staticGraph(entry: string): Set<string> {
  const seen = new Set<string>();
  const visit = (file: string) => {
    if (seen.has(file)) return;
    seen.add(file);
    for (const m of sourceText(file).matchAll(/(?:^|\n)\s*(?:import|export)\s(?!type\s)[^"';]*?from\s*["']([^"']+)["']|(?:^|\n)\s*import\s+["']([^"']+)["']/g)) {
      const target = resolveImport(file, (m[1] ?? m[2])!);
      if (target) visit(target);
    }
  };
  visit(entry);
  return new Set([...seen].map((f) => relative(repoRoot, f)));
}

describe("the device card's route", () => {
  it("does not load the booklet PDF, object storage or passport issuing", () => {
    const graph = staticGraph(`${repoRoot}/app/[locale]/p/[token]/route.ts`);
    expect(graph.has("lib/qr/card-html.ts")).toBe(true);
    const heavy = [...graph].filter((f) => /^lib\/(pdf|storage)\/|^lib\/passport\/index\.ts$/.test(f));
    expect(heavy).toEqual([]);
  });
});
