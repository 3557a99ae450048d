// Every package Caddis runs with (the production dependency tree, from package-lock.json) that
// declares the Node.js versions it supports includes the Node.js running this test: a package
// that says it needs a newer Node.js is a risk nobody else tests for.
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";
import semver from "semver";
import { describe, expect, it } from "vitest";
import { repoRoot } from "../support/source-files";

type LockEntry = { version?: string; dev?: boolean; optional?: boolean; engines?: { node?: string } | string[] };
const lock = JSON.parse(readFileSync(join(repoRoot, "package-lock.json"), "utf8")) as { packages: Record<string, LockEntry> };
const own = JSON.parse(readFileSync(join(repoRoot, "package.json"), "utf8")) as { engines: { node: string }; dependencies: Record<string, string> };

/** Installed production packages (optional ones for other platforms are not installed). */
const production = Object.entries(lock.packages)
  .filter(([path, entry]) => path.startsWith("node_modules/") && !entry.dev && existsSync(join(repoRoot, path, "package.json")))
  .map(([path]) => {
    const pkg = JSON.parse(readFileSync(join(repoRoot, path, "package.json"), "utf8")) as { name: string; version: string; engines?: { node?: string } };
    return { name: `${pkg.name}@${pkg.version}`, node: pkg.engines?.node };
  });

describe("Node.js engines of the production dependencies", () => {
  it("reads the whole production tree", () => {
    expect(production.length).toBeGreaterThan(100);
    for (const name of Object.keys(own.dependencies)) expect(production.some((p) => p.name.startsWith(`${name}@`)), name).toBe(true);
  });

  it(`each declared range includes the running Node.js (${process.version})`, () => {
    const excluded = production.filter((p) => p.node && !semver.satisfies(process.version, p.node, { includePrerelease: true })).map((p) => `${p.name} wants node ${p.node}`);
    expect(excluded).toEqual([]);
  });

  it("the project's own range includes it too", () => {
    expect(semver.satisfies(process.version, own.engines.node)).toBe(true);
  });
});
