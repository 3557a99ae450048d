import "server-only";
// Fonts for every PDF (booklet and GP summary), registered by absolute path from fonts/.
// Plain TrueType (scripts/fonts/make-pdf-fonts.sh): woff2 crashes fontkit, and WOFF tables are
// inflated again on every read. Latin and Latin Extended (Polish, Romanian) are one merged font:
// as two, every run of text that fell back to the second embedded a subset of its own — 150
// fonts, 225 KiB and a second for a Polish booklet. Arabic script is the fallback, in Naskh.
// Urdu stays in Naskh here: fontkit 2 stops on Noto Nastaliq Urdu's empty mark anchors (null
// anchor in a mark-to-base record) and the booklet fails; pages use Nastaliq (lib/i18n/fonts.ts).
// No static import of @react-pdf here: the worker loads it dynamically (see lib/pdf/gp-summary.tsx).
import path from "node:path";
import type { Font as PdfFont } from "@react-pdf/renderer";

export const PDF_FONT_FAMILY = ["CaddisLatin", "CaddisArabic"];

const faces: [family: string, folder: string, stem: string][] = [
  ["CaddisLatin", "atkinson-hyperlegible", "atkinson-hyperlegible-latin-all"],
  ["CaddisArabic", "noto-naskh-arabic", "noto-naskh-arabic-arabic"],
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
