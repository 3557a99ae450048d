// The booklet as people will hold it: its words in both languages (read back from the PDF with
// pdf-parse), and the QR on the cover decoded from a rendered page to the passport's own address.
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import jsQR from "jsqr";
import { PNG } from "pngjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getPdf } from "@/app/api/patients/[patientId]/passport/pdf/route";
import { POST as postPassport } from "@/app/api/patients/[patientId]/passport/route";
import ar from "@/messages/ar.json";
import en from "@/messages/en.json";
import pl from "@/messages/pl.json";
import { renderPassportPdf } from "@/lib/pdf";
import { qrPngDataUrl } from "@/lib/qr";
import { patientIdByHrn } from "../support/fixtures";

const catalogues = { ar, en, pl };
import { call, sessionFor } from "../support/http";

// pdf-parse 2.4.5 is CommonJS-first; its class reads the bytes, getText() gives every page's text.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { PDFParse } = require("pdf-parse") as typeof import("pdf-parse");

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-pdf-"));
let nurse: string;

async function issueAndDownload(hrn: string) {
  const patientId = await patientIdByHrn(hrn);
  const issued = await call(postPassport, `/api/patients/${patientId}/passport`, { cookie: nurse, body: { reissue: true }, params: { patientId } });
  expect(issued.status).toBe(201);
  const { url, shortCode } = await issued.json();
  const res = await call(getPdf, `/api/patients/${patientId}/passport/pdf`, { cookie: nurse, params: { patientId } });
  expect(res.status).toBe(200);
  const pdf = Buffer.from(await res.arrayBuffer());
  const file = path.join(dir, `${hrn}.pdf`);
  fs.writeFileSync(file, pdf);
  return { url, shortCode, pdf, file };
}

/** Text of the PDF without the zero-width direction marks and the stray control characters. */
async function textOf(pdf: Buffer) {
  const parser = new PDFParse({ data: pdf });
  try {
    const result = await parser.getText();
    return {
      pages: result.pages.length,
      // Lines wrap wherever the column ends: compare with all white space as single spaces.
      text: result.text
        .normalize("NFKC")
        .replace(/[\u0000-\u0008\u000b-\u001f\u061c\u200e\u200f]/g, "")
        .replace(/\s+/g, " "),
    };
  } finally {
    await parser.destroy();
  }
}

/** The PDF's text as poppler reads it (logical order), normalised like textOf. */
function popplerText(file: string) {
  return execFileSync("pdftotext", [file, "-"], { encoding: "utf8" })
    .normalize("NFKC")
    .replace(/[\u0000-\u0008\u000b-\u001f\u061c\u200e\u200f\u202a-\u202e]/g, "")
    .replace(/\s+/g, " ");
}

/** Renders page 1 with poppler and reads the QR code on it. */
function qrOnCover(file: string): string | null {
  const out = path.join(dir, path.basename(file, ".pdf"));
  execFileSync("pdftoppm", ["-png", "-r", "150", "-f", "1", "-l", "1", "-singlefile", file, out]);
  const png = PNG.sync.read(fs.readFileSync(`${out}.png`));
  return jsQR(new Uint8ClampedArray(png.data.buffer, png.data.byteOffset, png.data.length), png.width, png.height)?.data ?? null;
}

beforeAll(async () => {
  nurse = await sessionFor("communityNurse");
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const pdfWords = (locale: "pl" | "ar" | "en") => (catalogues[locale] as typeof en).PassportPdf;
const vocab = (locale: "pl" | "ar" | "en") => (catalogues[locale] as typeof en).Vocabulary;

describe("passport booklet (PDF)", () => {
  it("Polish and English side by side: device facts, dates, allergies, contacts, safety line; diacritics kept", async () => {
    const { pdf, shortCode } = await issueAndDownload("EM-100-002");
    const { text, pages } = await textOf(pdf);
    expect(pages).toBeGreaterThanOrEqual(5);
    const pl = pdfWords("pl");
    const enW = pdfWords("en");
    const plV = vocab("pl");
    const enV = vocab("en");
    // Seed: Halina's catheter in place is 14 Ch, 10 ml, hydrogel-coated latex, female length, lot HN2404.
    for (const phrase of [
      pl.title, enW.title,
      plV.device.size, enV.device.size, "14 Ch (4,7 mm)", "14 Ch (4.7 mm)",
      plV.device.balloon, enV.device.balloon, "10 ml jałowej wody", "10 ml sterile water",
      plV.material["hydrogel-coated-latex"], enV.material["hydrogel-coated-latex"],
      plV.lengthCategory.female, enV.lengthCategory.female,
      plV.route.urethral, enV.route.urethral,
      "HN2404", "Northfen Medical (demo)",
      pl.nextChange, enW.nextChange, pl.reviewDue, enW.reviewDue,
      pl.noAllergies, enW.noAllergies,
      "01632 960 210", "01632 960 299", "Quayside Practice",
      "Zadzwoń natychmiast pod 999, jeśli:", "Call 999 now if you:",
      pl.helpGeneral, enW.helpGeneral,
      pl.translationNote, enW.translationNote,
      shortCode,
    ]) {
      expect(text, phrase).toContain(phrase);
    }
    // History, most recent first: her unplanned changes for blockage, in both languages.
    expect(text).toContain(`${plV.eventKind.unplanned_change} (${plV.unplannedReason.blockage})`);
    expect(text).toContain(`${enV.eventKind.unplanned_change} (${enV.unplannedReason.blockage})`);
    expect(text.indexOf("HN2404", text.indexOf(enW.historyTitle))).toBeLessThan(text.indexOf("HN2400", text.indexOf(enW.historyTitle)));
  });

  it("Arabic and English: the Arabic words are there (right to left), with the English facts beside them", async () => {
    const { pdf, file } = await issueAndDownload("EM-100-003");
    const { text, pages } = await textOf(pdf);
    const poppler = popplerText(file);
    expect(pages).toBeGreaterThanOrEqual(5);
    const ar = pdfWords("ar");
    const arV = vocab("ar");
    const enW = pdfWords("en");
    const enV = vocab("en");
    // Words whose glyphs map back cleanly, read by poppler in reading order (pdf.js splits a word
    // where a mark is raised above its letter, as the font places it). Yusuf: suprapubic, 16 Ch,
    // 10 ml, all silicone, chlorhexidine allergy.
    for (const word of [arV.device.route, arV.device.size, arV.device.balloon, arV.device.length, ar.allergiesTitle, "سيليكون", "معقم"]) {
      expect(poppler, word).toContain(word);
    }
    for (const phrase of [
      enV.route.suprapubic, "16 Ch (5.4 mm)", "10 ml sterile water", enV.material["all-silicone"],
      enV.allergen.chlorhexidine, "YH5520", enW.translationNote, "Call 999 now if you:",
    ]) {
      expect(text, phrase).toContain(phrase);
    }
    // The Arabic size line keeps "16 Ch" as one left-to-right run next to the Arabic unit.
    expect(text).toMatch(/\(مم 5\.4 \) 16 Ch|16 Ch \(5\.4 مم\)/);
  });

  it("carries a QR on the cover that decodes to the passport's own device-card address", async () => {
    const { url, file } = await issueAndDownload("EM-100-006");
    expect(url).toMatch(/\/p\/[A-Za-z0-9_-]{43}$/);
    expect(qrOnCover(file)).toBe(url);
  });

  it("runs a long history over as many pages as it needs, most recent first, nothing cut", async () => {
    const url = "http://localhost:3000/p/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA";
    const events = Array.from({ length: 70 }, (_, i) => ({
      at: new Date(Date.UTC(2026, 0, 1) - i * 7 * 86_400_000),
      kind: "unplanned_change" as const,
      reason: "blockage" as const,
      twocOutcome: null,
      byName: "Grace Mensah",
      organisationName: "Harbourside Community Nursing Team",
      sizeCh: 14,
      material: "all-silicone" as const,
      lot: `LOT${String(i).padStart(3, "0")}`,
    }));
    const pdf = await renderPassportPdf({
      locales: ["pl", "en"],
      region: "GB",
      translationReviews: { pl: { reviewerName: "Test Reviewer", reviewedOn: "2026-11-20" } },
      url,
      shortCode: "ABCD-EFGH-JKMN",
      qrPngDataUrl: await qrPngDataUrl(url),
      issuedAt: new Date(),
      issuedByName: "Grace Mensah",
      patient: { givenName: "Test", familyName: "Patient", dateOfBirth: "1950-01-01", healthRecordNumber: "EM-TEST", allergies: { latex: "yes", chlorhexidine: "no", lidocaine: "no", other: null } },
      device: null,
      history: events,
      contacts: { emergencyNumber: "999", outOfHoursServiceName: null, careTeams: [], gp: null },
    });
    const { text, pages } = await textOf(pdf);
    expect(pages).toBeGreaterThanOrEqual(8);
    for (const e of events) expect(text, e.lot).toContain(e.lot);
    expect(text.indexOf("LOT000")).toBeLessThan(text.indexOf("LOT069"));
    expect(text).toContain(pdfWords("pl").noDevice);
    expect(text).toContain("Lateks");
    // Polish reviewed by a medical translator: its foot says so, and no caution is left in either language.
    expect(text).toContain("Sprawdzone przez tłumacza medycznego dnia 20 listopada 2026");
    expect(text).not.toContain(pdfWords("pl").translationNote);
    expect(text).not.toContain(pdfWords("en").translationNote);
  });
});
