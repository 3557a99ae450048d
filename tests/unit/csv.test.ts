// CSV cells: RFC 4180 quoting and OWASP's CSV-injection advice (prefix cells a spreadsheet would
// read as a formula).
import { describe, expect, it } from "vitest";
import { csvCell, toCsv } from "@/lib/http/csv";

describe("csvCell", () => {
  it("prefixes = + - @ tab and carriage return with a quote mark", () => {
    expect(csvCell("=1+1")).toBe("'=1+1");
    expect(csvCell("+44 1632")).toBe("'+44 1632");
    expect(csvCell("-3")).toBe("'-3");
    expect(csvCell("@SUM(A1)")).toBe("'@SUM(A1)");
    expect(csvCell("\tx")).toBe("'\tx");
  });
  it("leaves ordinary text and numbers alone, and empty for null", () => {
    expect(csvCell("Arthur Pell")).toBe("Arthur Pell");
    expect(csvCell("EM-100-001")).toBe("EM-100-001");
    expect(csvCell(14)).toBe("14");
    expect(csvCell(null)).toBe("");
    expect(csvCell(undefined)).toBe("");
  });
  it("quotes commas, quotes and line breaks", () => {
    expect(csvCell('a,"b"')).toBe('"a,""b"""');
    expect(csvCell("line\nbreak")).toBe('"line\nbreak"');
    expect(csvCell('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
  });
  it("joins rows with CRLF", () => {
    expect(toCsv([["a", 1], ["b", null]])).toBe("a,1\r\nb,\r\n");
  });
});
