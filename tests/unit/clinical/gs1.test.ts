import bwipjs from "bwip-js/node";
import { format, isValid, lastDayOfMonth, parse } from "date-fns";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { gs1CheckDigit, gs1Date, isValidGtin, parseGs1 } from "@/lib/clinical";

const GS = "\u001d";
const TODAY = "2025-06-15";

/** bwip-js refuses a GTIN with a wrong check digit ("AI 01: Bad checksum"). */
function bwipAccepts(gtin14: string): boolean {
  try {
    bwipjs.toSVG({ bcid: "gs1-128", text: `(01)${gtin14}` });
    return true;
  } catch (e) {
    if (/Bad checksum/.test(String(e))) return false;
    throw e;
  }
}

describe("isValidGtin", () => {
  it.each([
    ["6291041500213", true], // Source: GS1 General Specifications 7.9.1 (629104150021 → check digit 3)
    ["09506000134352", true], // Source: GS1 General Specifications 7.9.1 (0950600013435 → 2)
    ["09506000134353", false], // Source: GS1 General Specifications 7.9.1 (stated invalid)
    ["09504000059118", true], // Source: GS1 General Specifications 7.9.1 (stated valid)
    ["96385074", true], // from memory: a GTIN-8 example used in GS1 training material
    ["036000291452", true], // from memory: a widely printed UPC-A (GTIN-12) example
    ["0950600013435", false], // 13 digits of the 14-digit example: wrong check digit
    ["", false],
    ["1234567", false],
    ["0950600013435X", false],
    ["123456789012345", false],
  ])("%s → %s", (digits, valid) => {
    expect(isValidGtin(digits)).toBe(valid);
  });

  it("check digit of the GS1 examples", () => {
    // Source: GS1 General Specifications 7.9.1
    expect(gs1CheckDigit("629104150021")).toBe(3);
    expect(gs1CheckDigit("0950600013435")).toBe(2);
  });

  it("refuses non-strings", () => {
    expect(isValidGtin(9506000134352 as unknown as string)).toBe(false);
  });

  it("agrees with bwip-js on the GS1 examples", () => {
    for (const g of ["09506000134352", "09506000134353", "09504000059118", "06291041500213"]) {
      expect(isValidGtin(g)).toBe(bwipAccepts(g));
    }
  });

  it("agrees with bwip-js for random GTINs of every length, right and wrong check digits", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(8, 12, 13, 14),
        fc.stringMatching(/^\d{13}$/),
        fc.integer({ min: 0, max: 9 }),
        (len, digits, check) => {
          const gtin = digits.slice(0, len - 1) + String(check);
          expect(isValidGtin(gtin)).toBe(bwipAccepts(gtin.padStart(14, "0")));
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe("parseGs1", () => {
  it("reads the General Specifications example with a group separator", () => {
    // Source: GS1 General Specifications, AIs (01) GTIN, (17) expiry, (10) lot, (21) serial and the check digit of section 7.9.1
    const r = parseGs1(`01095060001343521728110010AB12${GS}21XYZ`, TODAY);
    expect(r).toMatchObject({ gtin: "09506000134352", expiry: "2028-11-30", lot: "AB12", serial: "XYZ", errors: [] });
  });

  it.each([
    ["]C1"], // Source: GS1 General Specifications (symbology identifier for GS1-128)
    ["]d2"], // Source: GS1 General Specifications (GS1 DataMatrix)
    ["]Q3"], // Source: GS1 General Specifications (GS1 QR Code)
  ])("strips the %s symbology prefix", (prefix) => {
    const r = parseGs1(`${prefix}01095060001343521728110010AB12${GS}21XYZ\r\n`, TODAY);
    expect(r).toMatchObject({ gtin: "09506000134352", lot: "AB12", serial: "XYZ", errors: [] });
  });

  it("reads the printed bracket form", () => {
    // Source: GS1 General Specifications (human-readable interpretation)
    const r = parseGs1("(01)09506000134352 (17)281100 (10)AB12 (21)XYZ", TODAY);
    expect(r).toMatchObject({ gtin: "09506000134352", expiry: "2028-11-30", lot: "AB12", serial: "XYZ", errors: [] });
  });

  it("reads a production date (AI 11) and a lot last without a separator", () => {
    // Source: GS1 General Specifications (a variable field ends the string without GS)
    const r = parseGs1("010950600013435211240301" + "10LOT-7/A", TODAY);
    expect(r).toMatchObject({ productionDate: "2024-03-01", lot: "LOT-7/A", errors: [] });
  });

  it("a wrong GTIN check digit is an error and the GTIN is left out", () => {
    // Source: GS1 General Specifications 7.9.1 (09506000134353 invalid)
    const r = parseGs1("(01)09506000134353(17)281130", TODAY);
    expect(r.gtin).toBeUndefined();
    expect(r.expiry).toBe("2028-11-30");
    expect(r.errors.join()).toMatch(/AI 01: check digit/);
  });

  it.each([
    ["240200", "2024-02-29"], // Source: GS1 General Specifications (day 00 = last day); 2024 is a leap year
    ["250200", "2025-02-28"], // Source: GS1 General Specifications (day 00 = last day); 2025 is not
    ["000200", "2000-02-29"], // Source: Gregorian calendar (2000 divisible by 400 is a leap year)
    ["240229", "2024-02-29"], // Source: Gregorian calendar
    ["281231", "2028-12-31"],
    ["280400", "2028-04-30"],
  ])("expiry %s → %s", (yymmdd, iso) => {
    expect(parseGs1(`(17)${yymmdd}`, TODAY)).toMatchObject({ expiry: iso, errors: [] });
  });

  it.each([
    ["290229"], // Source: GS1 General Specifications (impossible date is an error): 2029 is not a leap year
    ["250431"], // Source: Gregorian calendar (April has 30 days)
    ["251301"], // month 13
    ["250015"], // month 00
  ])("impossible expiry %s is an error, not a shifted date", (yymmdd) => {
    const r = parseGs1(`(17)${yymmdd}`, TODAY);
    expect(r.expiry).toBeUndefined();
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatch(/^AI 17/);
  });

  it.each([
    ["2025-06-15", "750101", "2075-01-01"], // Source: GS1 General Specifications 7.12 (from memory): 75−25 = 50 → this century
    ["2025-06-15", "760101", "1976-01-01"], // Source: GS1 GS 7.12 (from memory): 76−25 = 51 → previous century
    ["2099-06-15", "490101", "2149-01-01"], // Source: GS1 GS 7.12 (from memory): 49−99 = −50 → next century
    ["2099-06-15", "500101", "2050-01-01"], // Source: GS1 GS 7.12 (from memory): 50−99 = −49 → this century
  ])("century window: today %s, %s → %s", (today, yymmdd, iso) => {
    expect(gs1Date(yymmdd, today)).toBe(iso);
  });

  it("takes today as a Date too", () => {
    expect(gs1Date("281100", new Date(2025, 5, 15))).toBe("2028-11-30");
  });

  it("flags a lot too long, as when the scanner dropped the group separator", () => {
    // Source: GS1 General Specifications (AI 10 up to 20 characters)
    const r = parseGs1("0109506000134352" + "10ABCDEFGHIJKLMNOPQRSTU", TODAY);
    expect(r.lot).toBeUndefined();
    expect(r.errors[0]).toMatch(/AI 10: must be 1 to 20/);
  });

  it("reports unknown AIs, bad characters, short fixed fields and empty input", () => {
    expect(parseGs1("", TODAY).errors).toEqual(["nothing to read"]);
    expect(parseGs1("9912345", TODAY).errors[0]).toMatch(/unknown or unsupported AI/);
    expect(parseGs1("(99)12345", TODAY).errors[0]).toMatch(/AI 99: unknown/);
    expect(parseGs1("(10)AB#12", TODAY).errors[0]).toMatch(/AI 10: contains a character/);
    expect(parseGs1("(01)0950600013435", TODAY).errors[0]).toMatch(/AI 01: must be 14/);
    expect(parseGs1("(17)28A100", TODAY).errors[0]).toMatch(/AI 17: must be digits/);
    expect(parseGs1("junk(01)09506000134352", TODAY).errors[0]).toMatch(/before the first AI/);
    expect(parseGs1("(17)281100(17)281200", TODAY).errors[0]).toMatch(/appears twice/);
    expect(gs1Date("2811", TODAY)).toEqual({ error: expect.stringMatching(/six digits/) });
  });

  it("keeps every element read, including ones it does not map", () => {
    const r = parseGs1(`0109506000134352${GS}30${"12"}${GS}71012345`, TODAY);
    expect(r.elements).toEqual([
      { ai: "01", value: "09506000134352" },
      { ai: "30", value: "12" },
      { ai: "710", value: "12345" },
    ]);
  });
});

describe("GS1 date rules agree with date-fns", () => {
  it("day 00 is the last day of the month for every month 2000-2049", () => {
    for (let y = 0; y < 50; y++) {
      for (let m = 1; m <= 12; m++) {
        const yymm = `${String(y).padStart(2, "0")}${String(m).padStart(2, "0")}`;
        const expected = format(lastDayOfMonth(new Date(2000 + y, m - 1, 1)), "yyyy-MM-dd");
        expect(gs1Date(`${yymm}00`, TODAY)).toBe(expected);
      }
    }
  });

  it("a YYMMDD is accepted exactly when date-fns finds it a real date", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 74 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 31 }), (yy, mm, dd) => {
        const yymmdd = [yy, mm, dd].map((n) => String(n).padStart(2, "0")).join("");
        const real = isValid(parse(`20${yymmdd}`, "yyyyMMdd", new Date()));
        const ours = gs1Date(yymmdd, TODAY);
        expect(typeof ours === "string").toBe(real);
        if (real) expect(ours).toBe(`20${yymmdd.slice(0, 2)}-${yymmdd.slice(2, 4)}-${yymmdd.slice(4)}`);
      }),
      { numRuns: 500 },
    );
  });
});

describe("parseGs1 edge cases", () => {
  it("a bracket inside a scanned lot does not switch to the bracket form", () => {
    // Source: GS1 General Specifications (character set 82 allows "(" in AI 10)
    const r = parseGs1(`0109506000134352${"10"}AB(12)${GS}21X`, TODAY);
    expect(r).toMatchObject({ gtin: "09506000134352", lot: "AB(12)", serial: "X", errors: [] });
  });

  it("a group separator after a fixed field is skipped", () => {
    // Source: GS1 General Specifications (FNC1 after a fixed-length field is allowed)
    expect(parseGs1(`]C1${GS}0109506000134352${GS}17281100`, TODAY)).toMatchObject({ gtin: "09506000134352", expiry: "2028-11-30", errors: [] });
  });
});
