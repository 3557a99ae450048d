// lib/ keeps the modules a browser may load visibly apart from server code: every module outside
// the browser-safe places starts with `import "server-only"` (a browser bundle that reaches one
// fails to build), and a browser-safe module imports only browser-safe ones.
import { relative } from "node:path";
import { describe, expect, it } from "vitest";
import { repoRoot, runtimeImports, sourceFiles, sourceText } from "../support/source-files";

/** Browser-safe: pure rules, shared shapes, browser helpers, zod schemas, routing and the auth client. */
const BROWSER_SAFE = [
  /^lib\/clinical\//,
  /^lib\/shared\//,
  /^lib\/browser\//,
  /^lib\/validations\//,
  /^lib\/i18n\/(routing|navigation|client-namespaces)\.ts$/,
  /^lib\/auth\/(client|password-rules)\.ts$/,
];
/** Neither side's code but Next.js's own: fonts for the root layout (next/font runs at build time). */
const NEITHER = [/^lib\/i18n\/fonts\.ts$/];

const rel = (path: string) => relative(repoRoot, path);
const isBrowserSafe = (path: string) => BROWSER_SAFE.some((r) => r.test(rel(path)));
const lib = sourceFiles(`${repoRoot}/lib`).filter((f) => !NEITHER.some((r) => r.test(rel(f))));
/** The first statement after the leading comments. */
const firstStatement = (text: string) => text.replace(/^(\s*(\/\/[^\n]*\n|\/\*[\s\S]*?\*\/))*\s*/, "").split("\n")[0];

describe("server-only modules in lib/", () => {
  it("every module outside the browser-safe places starts with import \"server-only\"", () => {
    const missing = lib.filter((f) => !isBrowserSafe(f) && firstStatement(sourceText(f)) !== 'import "server-only";').map(rel);
    expect(missing, "add import \"server-only\"; as the first line, or move the module to a browser-safe place").toEqual([]);
  });

  it("no browser-safe module says server-only", () => {
    expect(lib.filter((f) => isBrowserSafe(f) && sourceText(f).includes('import "server-only"')).map(rel)).toEqual([]);
  });

  it("a browser-safe module imports nothing from server code (lib's server modules, db/)", () => {
    const wrong: string[] = [];
    for (const f of lib.filter(isBrowserSafe)) {
      for (const target of runtimeImports(f)) {
        const r = rel(target);
        const server = r.startsWith("db/") || (r.startsWith("lib/") && !isBrowserSafe(target));
        if (server) wrong.push(`${rel(f)} → ${r}`);
      }
    }
    expect(wrong).toEqual([]);
  });

  it("lib/clinical imports nothing from React, Next.js or the database", () => {
    const wrong = lib
      .filter((f) => rel(f).startsWith("lib/clinical/"))
      .flatMap((f) => [...sourceText(f).matchAll(/from\s+["']([^"']+)["']/g)].map((m) => m[1]).filter((spec) => !spec.startsWith(".")).map((spec) => `${rel(f)} → ${spec}`));
    expect(wrong).toEqual([]);
  });
});
