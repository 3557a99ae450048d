import "server-only";
// The one right-to-left fix for Caddis's PDFs (pdfText), seen in rendered pages of both. First,
// the right-to-left marks Intl puts inside Arabic dates ("2‏/11‏/2026") come out of order in
// @react-pdf 4.9 (the parts swap places), so they are taken out. Then, @react-pdf slices a glyph run from the last
// glyph of its first character, so an Arabic run that begins with a dotted letter (a base glyph
// plus a dot mark in Noto Sans Arabic) loses its base glyph and is measured too narrow: lines
// overflow and the first letter shows only its dots. Every Arabic run begins after a space or
// Latin text (a different font), so each one starts with U+061C ARABIC LETTER MARK: zero width,
// right to left, and in the Arabic font's own run. Latin letters and digits inside a right-to-left
// line are held together as one left-to-right run (LRM on each side), so "16 Ch" stays "16 Ch".

const LRM = "\u200E";
const ALM = "\u061C";

/** Intl's right-to-left marks and any embedding or isolate controls (ours are LRM and ALM only). */
const foreignMarks = /[\u200F\u202A-\u202E\u2066-\u2069]/g;

/** Each Arabic-script run starts with ALM. */
function arabicRunSafe(text: string): string {
  return text.replace(/(^|[^\u0600-\u06FF])(?=[\u0600-\u06FF])/g, `$1${ALM}`);
}

/** Any text as a PDF line in this writing direction. */
export function pdfText(text: string, rtl: boolean): string {
  const plain = text.replace(foreignMarks, "");
  return rtl ? arabicRunSafe(plain) : plain;
}

/** A Latin or numeric value (a phone number, a lot, "16 Ch") kept left to right in a right-to-left line. */
export function ltrRun(value: string, rtl: boolean): string {
  return rtl ? `${LRM}${value}${LRM}` : value;
}

/** The same words with the marks above taken out, to compare two values as a reader sees them. */
export function withoutMarks(text: string): string {
  return text.replace(/[\u200E\u061C]/g, "");
}

/** Direction and alignment for a block of text in this writing direction. */
export function direction(rtl: boolean) {
  return rtl ? ({ direction: "rtl", textAlign: "right" } as const) : ({ direction: "ltr", textAlign: "left" } as const);
}
