import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import { dirname, join, resolve } from "node:path";

export const repoRoot = resolve(__dirname, "../..");

/** Every .ts/.tsx file under a directory, for tests that read the code itself. */
export function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return /\.tsx?$/.test(name) ? [path] : [];
  });
}

const texts = new Map<string, string>();
/** A source file's text, read once per test run. */
export function sourceText(path: string): string {
  let text = texts.get(path);
  if (text === undefined) {
    text = readFileSync(path, "utf8");
    texts.set(path, text);
  }
  return text;
}

/** The file an import specifier ("@/…" or relative) names, or undefined for a package. */
export function resolveImport(from: string, spec: string): string | undefined {
  let base: string;
  if (spec.startsWith("@/")) base = join(repoRoot, spec.slice(2));
  else if (spec.startsWith(".")) base = resolve(dirname(from), spec);
  else return undefined;
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, join(base, "index.ts"), join(base, "index.tsx")]) {
    if (existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  return undefined;
}

/** The project files a module imports at run time (type-only imports are erased, so left out). */
export function runtimeImports(path: string): string[] {
  const found: string[] = [];
  for (const match of sourceText(path).matchAll(/(?:import|export)\s[^"';]*?from\s*["']([^"']+)["']|import\(\s*["']([^"']+)["']\s*\)|import\s+["']([^"']+)["']/g)) {
    const spec = match[1] ?? match[2] ?? match[3];
    if (match[0].startsWith("import type") || match[0].startsWith("export type")) continue;
    const target = spec ? resolveImport(path, spec) : undefined;
    if (target) found.push(target);
  }
  return found;
}
