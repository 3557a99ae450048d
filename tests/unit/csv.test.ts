// CSV cells that a spreadsheet would run as formulas are defused (OWASP CSV injection).
import { describe, expect, it } from "vitest";
import { csvCell, toCsv } from "@/lib/csv";

describe("csvCell", () => {
  it.each([
    ["=1+1", "'=1+1"],
    ["+SUM(A1)", "'+SUM(A1)"],
    ["-2+3", "'-2+3"],
    ["@cmd", "'@cmd"],
    ["\tx", "'\tx"],
    ["\r=x", "\"'\r=x\""],
    ["plain", "plain"],
    ['say "hi", then', '"say ""hi"", then"'],
    ["", ""],
  ])("%j → %j", (input, out) => {
    expect(csvCell(input)).toBe(out);
  });

  it("writes dates as ISO, objects as JSON, and starts with a byte-order mark", () => {
    expect(csvCell(new Date("2026-03-01T10:00:00Z"))).toBe("2026-03-01T10:00:00.000Z");
    expect(csvCell({ a: 1 })).toBe('"{""a"":1}"');
    expect(toCsv(["a"], [["=x"]])).toBe("\uFEFFa\r\n'=x\r\n");
  });
});
