import { readFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { sourceFiles } from "../support/source-files";
import en from "@/messages/en.json";
import { RECORD_KINDS } from "@/lib/validations/episode";
import { actionMessageKey } from "@/lib/shared/audit-actions";

// The access log shows each audit action in words; an action without a label showed its raw
// name ("bag-change.add"). Every action the code can write about a patient needs one.

const root = resolve(__dirname, "../..");

/** Audit actions named in the code: `action: "x"`, `openForWrite(ctx, "x")`, and the form views. */
function actionsInCode(): Set<string> {
  const found = new Set<string>();
  for (const file of ["app", "lib", "db"].flatMap((d) => sourceFiles(join(root, d)))) {
    const text = readFileSync(file, "utf8");
    for (const m of text.matchAll(/\baction: "([a-z][a-z0-9_.-]+)"|openForWrite\(\s*ctx,\s*"([a-z][a-z0-9_.-]+)"/g)) found.add((m[1] ?? m[2])!);
    if (text.includes("action: `episode.form.${kind}`")) for (const kind of RECORD_KINDS) found.add(`episode.form.${kind}`);
  }
  return found;
}

// Actions that are never about one patient, so never in a patient's access log.
const notAboutAPatient = [/^admin\./, /^account\./, /^staff\./, /^caseload\./, /^retention\./, /^passport\.card\.(invalid|typo)$/];

describe("access log labels", () => {
  it("finds the actions the code writes", () => {
    const actions = actionsInCode();
    expect(actions.size).toBeGreaterThan(40);
    expect(actions).toContain("episode.form.insertion");
    expect(actions).toContain("bag-change.add");
  });

  it("has words for every action written about a patient", () => {
    const labels = en.PatientAccessLog.actions as Record<string, string>;
    const missing = [...actionsInCode()]
      .filter((a) => !notAboutAPatient.some((r) => r.test(a)))
      .filter((a) => !(a.replace(/[^a-zA-Z0-9]/g, "_") in labels));
    expect(missing, "add to PatientAccessLog.actions in messages/*.json").toEqual([]);
  });

  it("the audit search has words for every action the code writes, about a patient or not", () => {
    const labels = { ...(en.PatientAccessLog.actions as Record<string, string>), ...(en.AdminAudit.actions as Record<string, string>) };
    const missing = [...actionsInCode()].filter((a) => !(actionMessageKey(a) in labels));
    expect(missing, "add to AdminAudit.actions in messages/*.json").toEqual([]);
  });
});
