import localFont from "next/font/local";

// Shipped under fonts/ (SIL Open Font License); nothing is fetched at build or run time.
// Atkinson Hyperlegible is split by the subsetter into basic Latin and Latin Extended files
// (Polish and Romanian letters); the browser falls through the stack glyph by glyph.
export const latin = localFont({
  src: [
    { path: "../../fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-400-normal.woff2", weight: "400" },
    { path: "../../fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-700-normal.woff2", weight: "700" },
  ],
  variable: "--font-latin",
  display: "swap",
  fallback: ["system-ui", "sans-serif"],
});

export const latinExt = localFont({
  src: [
    { path: "../../fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-ext-400-normal.woff2", weight: "400" },
    { path: "../../fonts/atkinson-hyperlegible/atkinson-hyperlegible-latin-ext-700-normal.woff2", weight: "700" },
  ],
  variable: "--font-latin-ext",
  display: "swap",
  preload: false,
});

// Arabic in Naskh; Urdu in Nastaliq, the hand Urdu readers expect (app/globals.css swaps it in
// for lang="ur").
export const arabic = localFont({
  src: [
    { path: "../../fonts/noto-naskh-arabic/noto-naskh-arabic-arabic-400-normal.woff2", weight: "400" },
    { path: "../../fonts/noto-naskh-arabic/noto-naskh-arabic-arabic-700-normal.woff2", weight: "700" },
  ],
  variable: "--font-arabic",
  display: "swap",
  preload: false,
});

export const nastaliq = localFont({
  src: [
    { path: "../../fonts/noto-nastaliq-urdu/noto-nastaliq-urdu-arabic-400-normal.woff2", weight: "400" },
    { path: "../../fonts/noto-nastaliq-urdu/noto-nastaliq-urdu-arabic-700-normal.woff2", weight: "700" },
  ],
  variable: "--font-nastaliq",
  display: "swap",
  preload: false,
});

export const fontVariables = `${latin.variable} ${latinExt.variable} ${arabic.variable} ${nastaliq.variable}`;
