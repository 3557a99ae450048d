// Urdu in the PDFs is set in Nastaliq, joined and right to left, as Urdu readers expect: the
// booklet embeds Noto Nastaliq Urdu for its Urdu text (and Naskh stays for Arabic), and a word
// drawn through the PDF kit is laid out as Nastaliq (each word climbs from left to right, so its
// ink is much taller than the same word in Naskh) and stays inside its box. Before the fixes in
// docs/pdf-fonts.md the booklet failed outright, then drew every glyph flat on one line.
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { createElement as h } from "react";
import { PNG } from "pngjs";
import { Document, Font, Page, Text, View, renderToBuffer } from "@react-pdf/renderer";
import { afterAll, describe, expect, it } from "vitest";
import { renderPassportPdf } from "@/lib/pdf";
import { pdfFontFamily, registerPdfFonts } from "@/lib/pdf/kit/fonts";
import { pdfText } from "@/lib/pdf/kit/rtl";
import { qrPngDataUrl } from "@/lib/qr";
import ur from "@/messages/ur.json";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-urdu-pdf-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function fontsOf(pdf: Buffer): string[] {
  const file = path.join(dir, `fonts-${Date.now()}.pdf`);
  fs.writeFileSync(file, pdf);
  return execFileSync("pdffonts", [file], { encoding: "utf8" })
    .split("\n")
    .slice(2)
    .map((line) => line.split(/\s+/)[0].replace(/^[A-Z]{6}\+/, ""))
    .filter(Boolean);
}

/** Ink bounding box (dark pixels) inside a rectangle of a rendered page. */
function ink(png: PNG, x0: number, y0: number, x1: number, y1: number) {
  let top = Infinity, bottom = -1, left = Infinity, right = -1;
  for (let y = Math.max(0, y0); y < Math.min(png.height, y1); y++) {
    for (let x = Math.max(0, x0); x < Math.min(png.width, x1); x++) {
      const i = (y * png.width + x) * 4;
      if (png.data[i] < 128 && png.data[i + 1] < 128 && png.data[i + 2] < 128) {
        top = Math.min(top, y);
        bottom = Math.max(bottom, y);
        left = Math.min(left, x);
        right = Math.max(right, x);
      }
    }
  }
  return { height: bottom - top + 1, width: right - left + 1, left, right };
}

describe("Urdu in the PDFs", () => {
  it("the booklet's Urdu text is in Noto Nastaliq Urdu, its English in the Latin face, and no Naskh is needed", async () => {
    const url = "http://localhost:3000/p/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA";
    const pdf = await renderPassportPdf({
      locales: ["ur", "en"],
      region: "GB",
      translationReviews: {},
      url,
      shortCode: "ABCD-EFGH-JKMN",
      qrPngDataUrl: await qrPngDataUrl(url),
      issuedAt: new Date(Date.UTC(2026, 10, 2, 10)),
      issuedByName: "Grace Mensah",
      patient: { givenName: "Test", familyName: "Patient", dateOfBirth: "1950-01-01", healthRecordNumber: "EM-TEST", allergies: { latex: "yes", chlorhexidine: "no", lidocaine: "no", other: null } },
      device: null,
      history: [],
      contacts: { emergencyNumber: "999", outOfHoursServiceName: null, careTeams: [], gp: null },
    });
    fs.writeFileSync(path.join(dir, "ur-booklet.pdf"), pdf);
    if (process.env.KEEP_PDF) fs.copyFileSync(path.join(dir, "ur-booklet.pdf"), process.env.KEEP_PDF);
    const fonts = fontsOf(pdf);
    expect(fonts).toContain("NotoNastaliqUrdu-Regular");
    expect(fonts).toContain("NotoNastaliqUrdu-Bold");
    expect(fonts).toContain("AtkinsonHyperlegible-Regular");
    expect(fonts.filter((f) => f.startsWith("NotoNaskhArabic"))).toEqual([]);
  });

  it("a word is drawn as Nastaliq through the PDF kit: joined, climbing, inside its box", async () => {
    registerPdfFonts(Font);
    // "Catheter" as the Urdu catalogue writes it.
    const word = ur.PassportPdf.documentTitle.split(" ")[0];
    expect(word).toMatch(/^[\u0600-\u06FF]+$/);
    const line = (family: string[]) =>
      h(
        View,
        { style: { width: 300, height: 110, marginBottom: 10 } },
        h(Text, { style: { fontFamily: family as unknown as string, fontSize: 36, direction: "rtl", textAlign: "right", lineHeight: 2.2 } }, pdfText(word, true)),
      );
    const doc = h(Document, null, h(Page, { size: [340, 260], style: { padding: 20 } }, line(pdfFontFamily("ur")), line(pdfFontFamily("ar"))));
    const file = path.join(dir, "word.pdf");
    fs.writeFileSync(file, await renderToBuffer(doc));
    // 72 dpi: one pixel a point.
    execFileSync("pdftoppm", ["-png", "-r", "72", "-singlefile", file, path.join(dir, "word")]);
    const png = PNG.sync.read(fs.readFileSync(path.join(dir, "word.png")));
    const nastaliq = ink(png, 0, 20, 340, 130);
    const naskh = ink(png, 0, 140, 340, 250);
    expect(nastaliq.height).toBeGreaterThan(0);
    expect(naskh.height).toBeGreaterThan(0);
    // Nastaliq's cascade: the word's ink is far taller than Naskh's (about 2.4 times; glyphs drawn
    // flat or shaped the wrong way come out about as tall, 1.2), and as wide as a whole word
    // (0.77 of Naskh's; shaped left to right, its glyphs piled up at 0.22).
    expect(nastaliq.height / naskh.height).toBeGreaterThan(1.8);
    expect(nastaliq.width / naskh.width).toBeGreaterThan(0.5);
    // Right aligned at the box's edge (x = 320), not pushed past it or left short.
    expect(nastaliq.right).toBeLessThanOrEqual(324);
    expect(nastaliq.right).toBeGreaterThan(300);
    expect(nastaliq.left).toBeGreaterThan(20);
  });
});
