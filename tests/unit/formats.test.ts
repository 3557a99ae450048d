// Dates and numbers in the deployment's region (Settings `region`), through one module.
import { readFileSync } from "node:fs";
import { relative, resolve } from "node:path";
import { describe, expect, it } from "vitest";
import { formattingLocale, makeFormat } from "@/lib/shared/formats";
import { sourceFiles } from "../support/source-files";

const now = new Date("2026-12-03T10:00:00Z");
const gb = (locale: string) => makeFormat({ locale, region: "GB", timeZone: "Europe/London", now });

describe("dates and numbers in the deployment's region", () => {
  it("English in a GB deployment is day month year with a 24-hour clock", () => {
    expect(formattingLocale("en", "GB")).toBe("en-GB");
    expect(gb("en").dateTime(now, { dateStyle: "medium" })).toBe("3 Dec 2026");
    expect(gb("en").dateTime(now, { weekday: "long", day: "numeric", month: "long" })).toBe("Thursday 3 December");
    expect(gb("en").dateTime(new Date("2026-12-03T15:05:00Z"), { hour: "numeric", minute: "2-digit" })).toBe("15:05");
  });

  it("the region is a setting: without one each language writes its own way", () => {
    expect(formattingLocale("en", null)).toBe("en");
    expect(makeFormat({ locale: "en", region: null, timeZone: "Europe/London", now }).dateTime(now, { dateStyle: "medium" })).toBe("Dec 3, 2026");
    expect(formattingLocale("en", "zz")).toBe("en");
  });

  it("a date in another year shows its year; one in this year does not", () => {
    const f = gb("en");
    const opts = { weekday: "long", day: "numeric", month: "long" } as const;
    expect(f.dateTime(new Date("2027-01-04T12:00:00Z"), opts)).toMatch(/^Monday,? 4 January 2027$/);
    expect(f.dateTime(new Date("2025-11-28T12:00:00Z"), opts)).toMatch(/^Friday,? 28 November 2025$/);
    expect(f.dateTime(new Date("2026-11-28T12:00:00Z"), opts)).toBe("Saturday 28 November");
  });

  it("numbers follow the language with the region", () => {
    expect(gb("en").number(1234.5)).toBe("1,234.5");
    expect(gb("pl").number(1234.5)).toMatch(/^1\s?234,5$/);
  });

  it("nothing formats dates or numbers but lib/shared/formats", () => {
    const root = resolve(__dirname, "../..");
    const files = ["app", "components", "lib"].flatMap((d) => sourceFiles(resolve(root, d)));
    const offenders = files
      .filter((f) => /\b(useFormatter|getFormatter|createFormatter)\b|toLocale(Date|Time)?String\(|new Intl\.(DateTimeFormat|NumberFormat)\(/.test(readFileSync(f, "utf8")))
      .map((f) => relative(root, f));
    // time-zone.ts and working-hours.ts compute calendar days, offsets and clock times (fixed
    // en-CA/en-US parts), never shown text.
    expect(offenders.sort()).toEqual(["lib/shared/formats.ts", "lib/shared/time-zone.ts", "lib/shared/working-hours.ts"]);
  });
});
