import "server-only";
// Fonts for every PDF (booklet and GP summary), registered by absolute path from fonts/.
// Plain TrueType (scripts/fonts/make-pdf-fonts.sh): woff2 crashes fontkit, and WOFF tables are
// inflated again on every read. Latin and Latin Extended (Polish, Romanian) are one merged font:
// as two, every run of text that fell back to the second embedded a subset of its own — 150
// fonts, 225 KiB and a second for a Polish booklet. Arabic script is the fallback: Arabic in
// Naskh, Urdu in Nastaliq, the hand Urdu readers expect (as on the pages, lib/i18n/fonts.ts).
// The Nastaliq file is made by scripts/fonts/nastaliq-for-pdf.py (fontkit stops on the font's
// empty mark anchors), and it draws right only with patches/@react-pdf+textkit and
// @react-pdf+render (right-to-left shaping, glyph offsets kept): docs/pdf-fonts.md.
// No static import of @react-pdf here: the worker loads it dynamically (see lib/pdf/gp-summary.tsx).
import path from "node:path";
import type { Font as PdfFont } from "@react-pdf/renderer";

export const PDF_FONT_FAMILY = ["CaddisLatin", "CaddisArabic"];

/** The font stack for text in one locale: Urdu in Nastaliq, other Arabic script in Naskh. */
export function pdfFontFamily(locale: string): string[] {
  return locale === "ur" ? ["CaddisLatin", "CaddisNastaliq"] : PDF_FONT_FAMILY;
}

const faces: [family: string, folder: string, stem: string][] = [
  ["CaddisLatin", "atkinson-hyperlegible", "atkinson-hyperlegible-latin-all"],
  ["CaddisArabic", "noto-naskh-arabic", "noto-naskh-arabic-arabic"],
  ["CaddisNastaliq", "noto-nastaliq-urdu", "noto-nastaliq-urdu-arabic"],
];

let registered = false;

export function registerPdfFonts(font: typeof PdfFont) {
  if (registered) return;
  const file = (folder: string, name: string) => path.join(process.cwd(), "fonts", folder, name);
  for (const [family, folder, stem] of faces) {
    font.register({
      family,
      fonts: [
        { src: file(folder, `${stem}-400-normal.ttf`), fontWeight: 400 },
        { src: file(folder, `${stem}-700-normal.ttf`), fontWeight: 700 },
      ],
    });
  }
  // Hyphenating clinical words and names helps no one; break only at spaces.
  font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
