// Comments and tests name published documents (title, edition, section) or the repository's own
// docs/, never notes kept outside the repository nor a path on someone's machine.
import { relative } from "node:path";
import { describe, expect, it } from "vitest";
import { repoRoot, sourceFiles, sourceText } from "../support/source-files";

// Built from parts so this file does not match itself.
const outsideNotes = ["clinical-checks", "security-accessibility", "architecture", "conventions", "visual", "toolchain", "product"].map((n) => `${n}.md`);
const machinePaths = [`/${"work"}/`, `/${"home"}/`, `/${"Users"}/`, `/${"root"}/`];

describe("sources are cited from the repository or the published documents", () => {
  const files = ["app", "components", "lib", "db", "tests", "scripts"].flatMap((d) => sourceFiles(`${repoRoot}/${d}`));

  it("no comment or test cites a note outside the repository or a machine path", () => {
    const found = files.flatMap((f) => {
      const text = sourceText(f);
      return [...outsideNotes, ...machinePaths].filter((needle) => text.includes(needle)).map((needle) => `${relative(repoRoot, f)}: ${needle}`);
    });
    expect(found).toEqual([]);
  });
});
