import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";
import { repoRoot, runtimeImports, sourceFiles, sourceText } from "../support/source-files";
import en from "@/messages/en.json";
import { clientNamespaces, type ClientScope } from "@/lib/i18n/client-namespaces";

// Each route scope sends only its client namespaces to the browser. This test walks the import
// graph from every file of a scope and fails when a client component there would read a
// namespace the scope does not send (the browser would show the raw key).

const root = repoRoot;
const localeDir = join(root, "app/[locale]");
const source = sourceText;
const imports = runtimeImports;

/** Top-level namespaces read by client code reachable from these entry files. */
function clientNamespacesFrom(entries: string[]): Map<string, Set<string>> {
  const used = new Map<string, Set<string>>();
  const seen = new Set<string>();
  const visit = (path: string, inClient: boolean) => {
    const client = inClient || /^\s*["']use client["']/.test(source(path));
    const key = `${client}:${path}`;
    if (seen.has(key)) return;
    seen.add(key);
    if (client) {
      const text = source(path);
      for (const match of text.matchAll(/use(?:Translations|ErrorText|SubmitFailure)\(\s*["']([A-Za-z]+)/g)) {
        const namespace = match[1]!;
        if (!used.has(namespace)) used.set(namespace, new Set());
        used.get(namespace)!.add(relative(root, path));
      }
    }
    for (const target of imports(path)) visit(target, client);
  };
  for (const entry of entries) visit(entry, false);
  return used;
}

function scopeOf(path: string): ClientScope {
  const first = relative(localeDir, path).split("/")[0];
  if (first === "(auth)") return "auth";
  if (first === "(portal)") return "portal";
  if (first === "(staff)") return "staff";
  if (first === "p") return "card";
  return "root";
}

const scopes = Object.keys(clientNamespaces) as ClientScope[];

describe("client message namespaces per route scope", () => {
  const entries = sourceFiles(localeDir);

  it.each(scopes)("the %s scope sends every namespace its client components read", (scope) => {
    const used = clientNamespacesFrom(entries.filter((path) => scopeOf(path) === scope));
    const sent = new Set<string>([...clientNamespaces.root, ...clientNamespaces[scope]]);
    const missing = [...used.keys()].filter((namespace) => !sent.has(namespace)).map((namespace) => `${namespace} (${[...used.get(namespace)!].join(", ")})`);

    expect(missing, `add to clientNamespaces.${scope} in lib/i18n/client-namespaces.ts`).toEqual([]);
  });

  it("names only namespaces that exist in the catalogue", () => {
    for (const scope of scopes) for (const namespace of clientNamespaces[scope]) expect(Object.keys(en), `${scope}: ${namespace}`).toContain(namespace);
  });

  it("keeps the public device card light: it sends no staff, portal or form namespaces", () => {
    expect([...clientNamespaces.root, ...clientNamespaces.card].length).toBeLessThanOrEqual(6);
  });
});
