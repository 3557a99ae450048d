// GS1 Digital Link: a QR code on packaging may carry the label's data as a web address. Read
// with the same check digit, length and date rules as an element string, and cross-checked
// against GS1's own JavaScript library (digital-link.js) and the standard's examples.
import { createRequire } from "node:module";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { gs1CheckDigit, parseGs1, parseGs1DigitalLink } from "@/lib/clinical";
import { readCameraText, readScan } from "@/lib/browser/gs1-input";

const require = createRequire(import.meta.url);
// GS1's library (CommonJS, test-only dependency).
const { DigitalLink } = require("digital-link.js") as { DigitalLink: (uri: string) => { getIdentifier(): Record<string, string>; getKeyQualifiers(): Record<string, string>; getAttributes(): Record<string, string>; isValid(): boolean } };

const TODAY = "2025-06-15";
const GS = "\u001d";

/** What GS1's library reads from the address, percent-decoded as ours is. */
function theirs(uri: string) {
  const dl = DigitalLink(uri);
  const q = dl.getKeyQualifiers();
  const a = dl.getAttributes();
  const dec = (v?: string) => (v === undefined ? undefined : decodeURIComponent(v));
  return { valid: dl.isValid(), gtin: dl.getIdentifier()["01"], lot: dec(q["10"]), serial: dec(q["21"]), expiry17: a["17"] };
}

describe("parseGs1DigitalLink: the standard's examples", () => {
  it.each([
    // from memory: GS1 Digital Link Standard: URI Syntax 1.2 (2021), examples with GS1's example GTIN 09520123456788
    ["https://id.gs1.org/01/09520123456788", { gtin: "09520123456788" }],
    ["https://id.gs1.org/01/09520123456788/10/ABC123/21/12345", { gtin: "09520123456788", lot: "ABC123", serial: "12345" }],
    ["https://example.com/01/09520123456788/22/2A/10/ABC123/21/12345?17=201225", { gtin: "09520123456788", lot: "ABC123", serial: "12345", expiry: "2020-12-25" }],
    // Source: digital-link.js 1.4.3 README (GS1's library), its example address
    ["https://dlnkd.tn.gg/01/00860080001300/10/12345/21/43786?linkType=gs1:allergenInfo", { gtin: "00860080001300", lot: "12345", serial: "43786" }],
  ])("%s", (uri, want) => {
    const r = parseGs1DigitalLink(uri, TODAY);
    expect(r.errors).toEqual([]);
    expect({ gtin: r.gtin, lot: r.lot, serial: r.serial, expiry: r.expiry }).toEqual({ lot: undefined, serial: undefined, expiry: undefined, ...want });
    expect(theirs(uri).valid, "GS1's library agrees it is valid").toBe(true);
  });
});

describe("parseGs1DigitalLink: the same rules as an element string", () => {
  // Source: clinical-checks.md §7 worked element string (GS1 General Specifications).
  const element = `0109506000134352` + `17281100` + `10AB12${GS}21XYZ`;
  const link = "https://packs.example.org/any/path/01/09506000134352/10/AB12/21/XYZ?17=281100";

  it("gives exactly what the element string gives", () => {
    const a = parseGs1(element, TODAY);
    const b = parseGs1DigitalLink(link, TODAY);
    expect({ gtin: b.gtin, lot: b.lot, serial: b.serial, expiry: b.expiry, errors: b.errors }).toEqual({ gtin: a.gtin, lot: a.lot, serial: a.serial, expiry: a.expiry, errors: a.errors });
  });

  it("a wrong check digit is an error and the GTIN is left out, as GS1's library says too", () => {
    const uri = "https://id.example.com/01/09506000134353/10/AB12";
    const r = parseGs1DigitalLink(uri, TODAY);
    expect(r.gtin).toBeUndefined();
    expect(r.errors).toContain("AI 01: check digit is wrong (09506000134353)");
    expect(theirs(uri).valid).toBe(false);
  });

  it("an impossible expiry in the query is an error, day 00 is the last day of the month", () => {
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352?17=290229", TODAY).errors).toEqual(["AI 17: 2029-02-29 is not a real date"]);
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352?17=280200", TODAY).expiry).toBe("2028-02-29");
  });

  it("decodes percent-encoded values and pads a GTIN-13", () => {
    const r = parseGs1DigitalLink("https://x.example/01/9506000134352/10/AB%2F12%25/21/S%28%29?17=281100", TODAY);
    expect({ gtin: r.gtin, lot: r.lot, serial: r.serial, errors: r.errors }).toEqual({ gtin: "09506000134352", lot: "AB/12%", serial: "S()", errors: [] });
    // A space (encoded or not) is not in GS1's character set; a "(" must be encoded.
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352/21/S%20", TODAY).errors).toEqual(["AI 21: percent-encoding is broken or missing"]);
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352/21/S(", TODAY).errors).toEqual(["AI 21: percent-encoding is broken or missing"]);
    expect(theirs("https://x.example/01/09506000134352/21/S(").valid).toBe(false);
  });

  it("refuses qualifiers out of order, a key in the query, and an address with no GTIN", () => {
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352/21/XYZ/10/AB12", TODAY).gtin).toBeUndefined();
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352/21/XYZ/10/AB12", TODAY).errors[0]).toMatch(/^no GTIN/);
    expect(parseGs1DigitalLink("https://x.example/01/09506000134352?10=AB12", TODAY).errors).toEqual(["AI 10: belongs in the path, not the query"]);
    expect(parseGs1DigitalLink("https://x.example/products/123", TODAY).errors[0]).toMatch(/^no GTIN/);
    expect(parseGs1DigitalLink("ftp://x.example/01/09506000134352", TODAY).errors).toEqual(["not a web address"]);
  });

  it("agrees with GS1's library on random addresses: GTIN (right or wrong check digit), lot, serial, expiry", () => {
    const cset = fc.constantFrom(..."ABCDEFGHJKLMNPQRSTUVWXYZabcdefghij0123456789-./_%&+,:;=!*'()");
    const value = fc.string({ unit: cset, minLength: 1, maxLength: 20 });
    fc.assert(
      fc.property(
        fc.string({ unit: fc.constantFrom(..."0123456789"), minLength: 13, maxLength: 13 }),
        fc.boolean(),
        fc.option(value, { nil: undefined }),
        fc.option(value, { nil: undefined }),
        fc.option(fc.tuple(fc.integer({ min: 25, max: 40 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 })), { nil: undefined }),
        fc.constantFrom("https://id.gs1.org", "https://packs.example.org/some/path", "http://brand.example"),
        (body, rightDigit, lot, serial, expiry, base) => {
          const check = gs1CheckDigit(body);
          const gtin = body + String(rightDigit ? check : (check + 1) % 10);
          const enc = encodeURIComponent;
          const yymmdd = expiry ? expiry.map((n) => String(n).padStart(2, "0")).join("") : undefined;
          const uri = `${base}/01/${gtin}${lot ? `/10/${enc(lot)}` : ""}${serial ? `/21/${enc(serial)}` : ""}${yymmdd ? `?17=${yymmdd}` : ""}`;
          const ours = parseGs1DigitalLink(uri, TODAY);
          const gs1 = theirs(uri);
          // Valid for both or for neither: a wrong check digit, or a character left unencoded
          // that the standard wants percent-encoded (encodeURIComponent leaves ! ' ( ) * as they are).
          expect(ours.errors.length === 0, `${uri} ${ours.errors}`).toBe(gs1.valid);
          if (!gs1.valid) return;
          expect(ours.gtin).toBe(gs1.gtin);
          expect(ours.lot).toBe(gs1.lot);
          expect(ours.serial).toBe(gs1.serial);
          if (yymmdd) expect(ours.expiry).toBe(`20${yymmdd.slice(0, 2)}-${yymmdd.slice(2, 4)}-${yymmdd.slice(4)}`);
        },
      ),
      { numRuns: 300, seed: 14 },
    );
  });
});

describe("the scan field and the camera read a Digital Link like an element string", () => {
  it("the scan field takes the address", () => {
    const r = readScan("https://x.example/01/09506000134352/10/AB12/21/XYZ?17=281100", TODAY);
    expect({ gtin: r.gtin, lot: r.lot, serial: r.serial, expiry: r.expiry, errors: r.errors }).toEqual({ gtin: "09506000134352", lot: "AB12", serial: "XYZ", expiry: "2028-11-30", errors: [] });
  });

  it("a Code 128 read without its FNC1 is refused, never split by guesswork", () => {
    // Lot HX-2217 then serial S0042: without the separator the lot would read "HX-221721S0042".
    const lost = readCameraText("010950600013435217281100" + "10HX-2217" + "21S0042", "code128", TODAY);
    expect(lost.lot).toBeUndefined();
    expect(lost.serial).toBeUndefined();
    expect(lost.errors[0]).toMatch(/^not a GS1-128 label/);
    const kept = readCameraText("]C1010950600013435217281100" + `10HX-2217${GS}21S0042`, "code128", TODAY);
    expect({ lot: kept.lot, serial: kept.serial, errors: kept.errors }).toEqual({ lot: "HX-2217", serial: "S0042", errors: [] });
  });
});
