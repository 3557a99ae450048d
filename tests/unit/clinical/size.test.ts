import { describe, expect, it } from "vitest";
import { charriereToMm, ClinicalInputError, mmToCharriere } from "@/lib/clinical";

describe("charriereToMm", () => {
  it.each([
    [12, 4.0], // Source: ISO 20696:2018 clause 5.5.2 (mm rounded up to 0.1)
    [14, 4.7], // Source: ISO 20696:2018 clause 5.5.2
    [16, 5.4], // Source: ISO 20696:2018 clause 5.5.2
    [18, 6.0], // Source: ISO 20696:2018 clause 5.5.2
    [6, 2.0], // Source: ISO 20696:2018 clause 5.5.2 (Ch = 3 × mm)
    [10, 3.4], // Source: ISO 20696:2018 clause 5.5.2 (3.33 rounded up)
    [20, 6.7], // Source: ISO 20696:2018 clause 5.5.2 (6.67 rounded up)
    [22, 7.4], // Source: ISO 20696:2018 clause 5.5.2 (7.33 rounded up)
    [24, 8.0], // Source: ISO 20696:2018 clause 5.5.2
    [30, 10.0], // Source: ISO 20696:2018 clause 5.5.2
  ])("%i Ch → %d mm", (ch, mm) => {
    expect(charriereToMm(ch)).toBe(mm);
  });

  it("multiples of 3 never pick up floating-point error", () => {
    for (let ch = 6; ch <= 39; ch += 3) expect(charriereToMm(ch)).toBe(ch / 3);
  });

  it.each([0, -2, 41, Number.NaN])("refuses %d Ch", (ch) => {
    expect(() => charriereToMm(ch)).toThrow(ClinicalInputError);
  });
});

describe("mmToCharriere", () => {
  it.each([
    [4.0, 12], // Source: ISO 20696:2018 clause 5.5.2
    [4.7, 14], // Source: ISO 20696:2018 clause 5.5.2
    [5.4, 16], // Source: ISO 20696:2018 clause 5.5.2
    [6.0, 18], // Source: ISO 20696:2018 clause 5.5.2
    [4.5, 13.5], // no whole Ch states 4.5 mm: 3 × mm
  ])("%d mm → %d Ch", (mm, ch) => {
    expect(mmToCharriere(mm)).toBe(ch);
  });

  it("round-trips every whole Ch size", () => {
    for (let ch = 4; ch <= 40; ch++) expect(mmToCharriere(charriereToMm(ch))).toBe(ch);
  });

  it("refuses an implausible diameter", () => {
    expect(() => mmToCharriere(20)).toThrow(ClinicalInputError);
  });
});
