// Numbers as typed: plain decimals with a point or a comma, and ranges said in words. The
// diary's own-amount box once saved "1e3" as 1000 ml and "0x10" as 16 ml.
import { describe, expect, it } from "vitest";
import { parsePlainDecimal, parseRangeCode } from "@/lib/shared/numbers";
import { customVolumeSchema, diaryEntrySchema } from "@/lib/validations/diary";
import { insertionObject } from "@/lib/validations/episode";
import { patientSchema } from "@/lib/validations/patient";
import { settingsPatchSchema } from "@/lib/validations/settings";
import { supplyRequestSchema } from "@/lib/validations/supply-request";
import { observationsSchema } from "@/lib/validations/visit";
import { caseloadQuerySchema } from "@/lib/validations/caseload";

const notPlain = ["1e3", "0x10", "0b11", "0o7", "Infinity", "NaN", "12 ml", "1.2.3", "1,2,3", "+", ".5", "5.", "١٢", "1_000"];

describe("plain decimals", () => {
  it("reads a point or a comma", () => {
    expect(parsePlainDecimal("250")).toBe(250);
    expect(parsePlainDecimal(" 37.5 ")).toBe(37.5);
    expect(parsePlainDecimal("37,5")).toBe(37.5);
    expect(parsePlainDecimal("-2")).toBe(-2);
  });

  it.each(notPlain)("refuses %j", (text) => {
    expect(parsePlainDecimal(text)).toBeUndefined();
  });

  it.each(notPlain)("the diary's own amount refuses %j (never 1000 or 16 ml)", (text) => {
    const r = customVolumeSchema.safeParse({ volumeMl: text });
    expect(r.success).toBe(false);
  });

  it("every numeric field refuses a number written as 1e3 or 0x10, in forms and API bodies alike", () => {
    const bad = (schema: { safeParse: (v: unknown) => { success: boolean; error?: { issues: { path: PropertyKey[] }[] } } }, body: unknown, path: string) => {
      const r = schema.safeParse(body);
      expect(r.success, `${path} ${JSON.stringify(body)}`).toBe(false);
      expect(r.error!.issues.map((i) => i.path.join(".")), path).toContain(path);
    };
    for (const v of ["1e3", "0x10"]) {
      bad(diaryEntrySchema, { patientId: "00000000-0000-4000-8000-000000000000", kind: "in", volumeMl: v }, "volumeMl");
      bad(insertionObject, { sizeCh: v }, "sizeCh");
      bad(insertionObject, { gelVolumeMl: v }, "gelVolumeMl");
      bad(patientSchema, { weightKg: v }, "weightKg");
      bad(settingsPatchSchema, { dueSoonDays: v }, "dueSoonDays");
      bad(supplyRequestSchema, { periodDays: 28, include: { legBag: true, valve: false, nightBag: false, gel: false }, items: [{ item: "catheter", quantity: v }] }, "items.0.quantity");
      bad(observationsSchema, { temperatureC: v }, "temperatureC");
      bad(caseloadQuerySchema, { page: v }, "page");
    }
  });

  it("a comma decimal is read where decimals are allowed", () => {
    const r = insertionObject.shape.gelVolumeMl.safeParse("2,5");
    expect(r.success && r.data).toBe(2.5);
    expect(observationsSchema.shape.temperatureC.safeParse("37,5").data).toBe(37.5);
  });

  it("a value out of range names the range and its unit", () => {
    const r = customVolumeSchema.safeParse({ volumeMl: "9000" });
    const code = r.error!.issues[0].message;
    expect(parseRangeCode(code)).toEqual({ min: 1, max: 5000, unit: "ml" });
    const ch = insertionObject.shape.sizeCh.safeParse("40");
    expect(parseRangeCode(ch.error!.issues[0].message)).toEqual({ min: 6, max: 30, unit: "ch" });
    // A whole number is asked for before the range.
    expect(customVolumeSchema.safeParse({ volumeMl: "12.5" }).error!.issues[0].message).toBe("whole_number");
  });
});
