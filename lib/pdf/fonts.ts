import "server-only";
// Fonts for PDFs, registered by absolute path from fonts/. @react-pdf needs the .woff files
// (woff2 crashes fontkit). Latin, Latin Extended (Polish, Romanian) and Arabic script (ar, ur)
// are separate subset files, so text uses a family list and each glyph falls back in order.
import path from "node:path";
import { Font } from "@react-pdf/renderer";

const dir = () => path.join(process.cwd(), "fonts");

export const PDF_FONT_FAMILY = ["CaddisLatin", "CaddisLatinExt", "CaddisArabic"];

let registered = false;

export function registerPdfFonts() {
  if (registered) return;
  const face = (folder: string, file: string) => path.join(dir(), folder, file);
  Font.register({
    family: "CaddisLatin",
    fonts: [
      { src: face("atkinson-hyperlegible", "atkinson-hyperlegible-latin-400-normal.woff"), fontWeight: 400 },
      { src: face("atkinson-hyperlegible", "atkinson-hyperlegible-latin-700-normal.woff"), fontWeight: 700 },
    ],
  });
  Font.register({
    family: "CaddisLatinExt",
    fonts: [
      { src: face("atkinson-hyperlegible", "atkinson-hyperlegible-latin-ext-400-normal.woff"), fontWeight: 400 },
      { src: face("atkinson-hyperlegible", "atkinson-hyperlegible-latin-ext-700-normal.woff"), fontWeight: 700 },
    ],
  });
  Font.register({
    family: "CaddisArabic",
    fonts: [
      { src: face("noto-sans-arabic", "noto-sans-arabic-arabic-400-normal.woff"), fontWeight: 400 },
      { src: face("noto-sans-arabic", "noto-sans-arabic-arabic-700-normal.woff"), fontWeight: 700 },
    ],
  });
  // Hyphenating clinical words and names helps no one; break only at spaces.
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
