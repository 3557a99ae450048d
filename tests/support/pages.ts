// Every page under app/[locale], found on disk, with the roles its page and layouts ask for
// (requirePageRole), so a suite over pages covers a page added later without being edited.
// A route handler there (route.ts) answers a whole HTML document, such as the device card, and
// counts as a page.
import fs from "node:fs";
import path from "node:path";

export const pagesRoot = path.resolve(__dirname, "../../app/[locale]");

export type PageFile = {
  /** URL pattern without route groups, e.g. "/[locale]/patients/[patientId]/history". */
  pattern: string;
  file: string;
  /** Roles every layout on the way and the page itself allow; null when none of them asks. */
  roles: string[] | null;
};

function rolesIn(file: string): string[] | null {
  if (!fs.existsSync(file)) return null;
  const text = fs.readFileSync(file, "utf8");
  const m = text.match(/requirePageRole\(\s*\w+\s*,([^)]*)\)/);
  if (!m) return null;
  return [...m[1].matchAll(/"(\w+)"/g)].map((x) => x[1]);
}

function intersect(a: string[] | null, b: string[] | null) {
  if (!a) return b;
  if (!b) return a;
  return a.filter((r) => b.includes(r));
}

export function listPages(dir = pagesRoot, inherited: string[] | null = null): PageFile[] {
  const roles = intersect(inherited, rolesIn(path.join(dir, "layout.tsx")));
  const out: PageFile[] = [];
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory() && !entry.name.startsWith("_")) out.push(...listPages(full, roles));
    else if (entry.name === "page.tsx" || entry.name === "route.ts") {
      const rel = path.relative(path.dirname(pagesRoot), dir).split(path.sep).filter((s) => !/^\(.*\)$/.test(s));
      out.push({ pattern: `/${rel.join("/")}`, file: full, roles: intersect(roles, rolesIn(full)) });
    }
  }
  return out.sort((a, b) => a.pattern.localeCompare(b.pattern));
}

/** Fills every [segment] with each of its values; throws when a segment has none. */
export function expandPattern(pattern: string, values: Record<string, readonly string[]>): string[] {
  const m = pattern.match(/\[(\w+)\]/);
  if (!m) return [pattern];
  const options = values[m[1]];
  if (!options?.length) throw new Error(`no demo value for [${m[1]}] in ${pattern}`);
  return options.flatMap((v) => expandPattern(pattern.replace(m[0], v), values));
}
