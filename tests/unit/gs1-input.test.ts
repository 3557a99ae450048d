// The scan field's normaliser: every way a scanner or a person sends a GS1 element string
// reaches parseGs1 in one form.
import { describe, expect, it } from "vitest";
import { GS, isGroupSeparatorKey, normaliseScan, readScan, showScan } from "@/lib/browser/gs1-input";

// Source: GS1 General Specifications, AIs (01) GTIN, (17) expiry, (10) lot, (21) serial and the check digit of section 7.9.1:
// 0109506000134352 17281100 10AB12 GS 21XYZ → GTIN 09506000134352, expiry 2028-11-30, lot AB12, serial XYZ.
const expected = { gtin: "09506000134352", expiry: "2028-11-30", lot: "AB12", serial: "XYZ", errors: [] };
const today = "2026-06-01";

describe("normaliseScan / readScan", () => {
  it.each([
    ["ASCII 29", "0109506000134352" + "17281100" + `10AB12${GS}21XYZ`],
    ["the text <GS>", "010950600013435217281100" + "10AB12<GS>21XYZ"],
    ["the text {GS}", "010950600013435217281100" + "10AB12{GS}21XYZ"],
    ["the text [GS] in lower case", "010950600013435217281100" + "10AB12[gs]21XYZ"],
    ["the visible symbol the field shows", "010950600013435217281100" + "10AB12\u241d21XYZ"],
    ["a trailing Enter and spaces", `  010950600013435217281100` + `10AB12${GS}21XYZ\r\n`],
    ["a DataMatrix symbology prefix", `]d2010950600013435217281100` + `10AB12${GS}21XYZ`],
    ["the printed bracket form", "(01)09506000134352(17)281100(10)AB12(21)XYZ"],
    ["the bracket form with spaces", "(01) 09506000134352 (17) 281100 (10) AB12 (21) XYZ"],
  ])("reads the worked example sent with %s", (_how, raw) => {
    const r = readScan(raw, today);
    expect({ gtin: r.gtin, expiry: r.expiry, lot: r.lot, serial: r.serial, errors: r.errors }).toEqual(expected);
  });

  it("turns every group-separator spelling into ASCII 29", () => {
    expect(normaliseScan("10A<GS>21B{GS}22C[GS]240D\u241d")).toBe(`10A${GS}21B${GS}22C${GS}240D${GS}`);
  });

  it("shows ASCII 29 as a visible symbol in the field", () => {
    expect(showScan(`10AB12${GS}21XYZ`)).toBe("10AB12\u241d21XYZ");
  });

  it("reports a wrong check digit and does not fill the GTIN", () => {
    // Source: GS1 General Specifications, section 7.9.1 (check digit): 09506000134353 is invalid.
    const r = readScan("(01)09506000134353(17)281100(10)AB12", today);
    expect(r.gtin).toBeUndefined();
    expect(r.errors.join(" ")).toMatch(/AI 01: check digit is wrong/);
    expect(r.lot).toBe("AB12");
  });

  it("without the separator the lot swallows the serial (why the field must keep it)", () => {
    const r = readScan("01095060001343521728110010AB1221XYZ", today);
    expect(r.lot).toBe("AB1221XYZ");
    expect(r.serial).toBeUndefined();
  });
});

describe("isGroupSeparatorKey", () => {
  it.each([
    [{ key: "]", ctrlKey: true }, true],
    [{ key: "x", ctrlKey: true, code: "BracketRight" }, true],
    [{ key: "GroupSeparator", ctrlKey: false }, true],
    [{ key: "F8", ctrlKey: false }, true],
    [{ key: "Unidentified", ctrlKey: false, keyCode: 29 }, true],
    [{ key: "]", ctrlKey: false }, false],
    [{ key: "1", ctrlKey: false, keyCode: 49 }, false],
  ])("%o → %s", (e, want) => {
    expect(isGroupSeparatorKey(e)).toBe(want);
  });
});
