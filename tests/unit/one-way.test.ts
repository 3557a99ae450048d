// One place for each client-side concern, kept so by reading the code: the browser calls the API
// through lib/browser/api-client only, says what went wrong in the one alert box, and every
// password box is the one PasswordField.
import { readFileSync } from "node:fs";
import { relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { sourceFiles } from "../support/source-files";

const root = resolve(__dirname, "../..");
const browserCode = ["app/[locale]", "components", "lib/browser", "lib/shared"].flatMap((d) => sourceFiles(resolve(root, d)));
const read = (path: string) => readFileSync(path, "utf8");
const rel = (path: string) => relative(root, path);

describe("one way to do each thing in the browser", () => {
  it("only lib/browser/api-client calls fetch (the presigned PUT to the object store is the one exception)", () => {
    const callers = browserCode.filter((f) => /(?<![\w.])fetch\(/.test(read(f))).map(rel).sort();
    expect(callers).toEqual(["components/uploads/upload-file.ts", "lib/browser/api-client.ts"]);
    expect(read(resolve(root, "components/uploads/upload-file.ts")).match(/(?<![\w.])fetch\(/g)).toHaveLength(1);
  });

  it("no hand-made alert: role=alert is written only in the form kit and the alert box", () => {
    const writers = browserCode.filter((f) => /role=["{]+alert["}]/.test(read(f)) || /role:\s*"alert"/.test(read(f))).map(rel);
    expect(writers.filter((f) => !f.startsWith("components/ui/"))).toEqual([]);
  });

  it("every password box is components/ui/password-field", () => {
    const boxes = browserCode.filter((f) => /type=["{]+password/.test(read(f))).map(rel);
    expect(boxes).toEqual(["components/ui/password-field.tsx"]);
  });

  it("server field errors reach a form in one place (setServerFieldErrors), not a loop per form", () => {
    const loops = browserCode.filter((f) => /Object\.entries\([^)]*fields\)[\s\S]{0,80}setError\(/.test(read(f))).map(rel);
    expect(loops).toEqual(["lib/browser/api-client.ts"]);
  });
});
