import { readdirSync, readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { FINDING_CODES, SOURCES, TRIAGE_RULES } from "@/lib/clinical";

// Test-only file reads; lib/clinical itself never imports node:.
const root = join(dirname(fileURLToPath(import.meta.url)), "..", "..", "..");
const doc = readFileSync(join(root, "docs", "clinical-safety.md"), "utf8");
const readme = readFileSync(join(root, "lib", "clinical", "README.md"), "utf8");

const SEVERITIES = ["minor", "significant", "considerable", "major", "catastrophic"];
const LIKELIHOODS = ["very low", "low", "medium", "high", "very high"];
// Source: DCB0129/0160 implementation guidance risk matrix (seen in secondary copies, not the published document)
const MATRIX: Record<string, number[]> = {
  "very high": [3, 4, 4, 5, 5],
  high: [2, 3, 3, 4, 5],
  medium: [2, 2, 3, 3, 4],
  low: [1, 2, 2, 3, 4],
  "very low": [1, 1, 2, 2, 3],
};
/** Every file of that name under tests/ (rules' tests are in tests/unit/clinical; controls built on them elsewhere). */
function findTests(file: string, dir = join(root, "tests")): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) return findTests(file, full);
    return entry.name === file ? [full] : [];
  });
}
/** The product's own code (not tests), where controls live. */
function codeFiles(dir = root): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = join(dir, entry.name);
    if (entry.isDirectory()) return ["app", "components", "db", "lib", "scripts", "proxy.ts"].includes(entry.name) || dir !== root ? codeFiles(full) : [];
    return /\.(ts|tsx)$/.test(entry.name) && (dir !== root || entry.name === "proxy.ts" || entry.name === "instrumentation.ts") ? [full] : [];
  });
}
const risk = (sev: string, lik: string) => MATRIX[lik][SEVERITIES.indexOf(sev)];

const rows = doc
  .split("\n")
  .filter((l) => /^\| H-/.test(l))
  .map((l) => l.split("|").slice(1, -1).map((c) => c.trim()));

describe("docs/clinical-safety.md", () => {
  it("the matrix at the top matches the lookup table", () => {
    for (const lik of LIKELIHOODS) {
      expect(doc).toContain(`| ${lik} | ${MATRIX[lik].join(" | ")} |`);
    }
  });

  it("has a row for each hazard these rules control", () => {
    expect(rows.length).toBeGreaterThanOrEqual(13);
    for (const name of ["length", "size", "Allergy", "Expired", "Missed change", "Missed sepsis", "bacteriuria", "low urine output"]) {
      expect(rows.some((r) => r[1].includes(name))).toBe(true);
    }
  });

  it("every row has 16 columns, valid grades, risks from the matrix and a status", () => {
    for (const r of rows) {
      expect(r).toHaveLength(16);
      const [iSev, iLik, iRisk] = [r[6], r[7], Number(r[8])];
      const [rSev, rLik, rRisk] = [r[10], r[11], Number(r[12])];
      expect(SEVERITIES).toContain(iSev);
      expect(SEVERITIES).toContain(rSev);
      expect(LIKELIHOODS).toContain(iLik);
      expect(LIKELIHOODS).toContain(rLik);
      expect(iRisk, `${r[0]} initial`).toBe(risk(iSev, iLik));
      expect(rRisk, `${r[0]} residual`).toBe(risk(rSev, rLik));
      expect(rRisk).toBeLessThanOrEqual(iRisk);
      expect(["open", "transferred", "closed"]).toContain(r[15]);
    }
  });

  it("every piece of code a control names exists in the code", () => {
    // Controls name their code (assertRecordOpen, planDates, PLAN_DEFAULTS…): a control whose
    // function was renamed or never written is no control at all.
    const code = codeFiles().map((f) => readFileSync(f, "utf8")).join("\n");
    const missing: string[] = [];
    for (const r of rows) {
      const controls = [r[5], r[9], r[14]].join(" ");
      const names = new Set([...controls.matchAll(/\b([a-z]+[A-Z][A-Za-z0-9]*|[A-Z][A-Z0-9]*_[A-Z0-9_]+)\b/g)].map((m) => m[1]));
      for (const name of names) {
        // Declared or used (a Web API such as localStorage is used, not declared).
        const present = new RegExp(`(function|const|let|class|type|interface)\\s+${name}\\b|\\b${name}\\s*[:=(.]`);
        if (!present.test(code)) missing.push(`${r[0]}: ${name}`);
      }
    }
    expect(missing).toEqual([]);
  });

  it("every cited test exists in the cited file", () => {
    for (const r of rows) {
      const cites = [...r[13].matchAll(/`([\w.-]+\.test\.ts)` › "([^"]+)"/g)];
      expect(cites.length, r[0]).toBeGreaterThan(0);
      for (const [, file, name] of cites) {
        const paths = findTests(file);
        expect(paths.length, `${r[0]}: ${file} exists under tests/`).toBeGreaterThan(0);
        expect(
          paths.some((p) => readFileSync(p, "utf8").includes(name)),
          `${r[0]}: ${file} › ${name}`,
        ).toBe(true);
      }
    }
  });
});

describe("lib/clinical/README.md", () => {
  it("lists every triage rule and every device finding code", () => {
    for (const rule of TRIAGE_RULES) expect(readme).toContain(rule.id);
    for (const code of FINDING_CODES) expect(readme).toContain(code.replace(/-unknown$/, ""));
  });

  it("every source id has its own title and an evidence grade", () => {
    const titles = Object.values(SOURCES).map((s) => s.title);
    expect(new Set(titles).size, "two sources share a title").toBe(titles.length);
    for (const s of Object.values(SOURCES)) {
      expect(s.title.length).toBeGreaterThan(5);
      expect(["seen", "recalled", "common-practice"]).toContain(s.evidence);
    }
  });
});
