// "Return to" after signing in goes to a path of this site only, never to another origin.
import { describe, expect, it } from "vitest";
import { sameSitePath } from "@/lib/shared/same-site-path";

describe("sameSitePath", () => {
  it("keeps a path on this site", () => {
    expect(sameSitePath("/en/p/abc/visit")).toBe("/en/p/abc/visit");
  });
  it("refuses another origin in any of its disguises, and nothing at all", () => {
    for (const v of ["//evil.example/x", "/\\evil.example", "https://evil.example", "javascript:alert(1)", "", null, undefined]) {
      expect(sameSitePath(v)).toBeUndefined();
    }
  });
});
