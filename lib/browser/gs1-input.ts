// What a packaging barcode looks like by the time it reaches a text field. USB scanners type
// the GS1 element string as keystrokes and send the group separator (FNC1) in different ways:
// as ASCII 29 itself, as a key combination (Ctrl+]), or as text such as "<GS>" or "{GS}".
// Labels are also typed by hand in the printed bracket form "(01)…(17)…(10)…".
// Everything is brought to one form here and then read by lib/clinical's parseGs1.
import { isWebAddress, parseGs1, parseGs1DigitalLink, type Gs1Result } from "@/lib/clinical";

export const GS = "\u001d";
/** Shown in the field instead of the invisible ASCII 29, so the nurse can see it arrived. */
export const GS_VISIBLE = "\u241d";

const GS_TEXT = /<GS>|\{GS\}|\[GS\]|<FNC1>|\{FNC1\}|\^\]|\u241d/gi;

/**
 * Every spelling of the group separator → ASCII 29; whitespace removed (GS1's character set
 * for these fields has no space, so a space is always typing or a line end).
 */
export function normaliseScan(raw: string): string {
  return raw.replace(GS_TEXT, GS).replace(/\s+/g, "");
}

/** For display in the scan field: ASCII 29 → the visible symbol. */
export function showScan(raw: string): string {
  return raw.replace(/\u001d/g, GS_VISIBLE);
}

/**
 * True for a key a scanner sends for the group separator: Ctrl+] (ASCII 29 on a US keyboard
 * layout), the GroupSeparator key value, or F8 which several scanners can be set to send.
 */
export function isGroupSeparatorKey(e: { key: string; ctrlKey: boolean; code?: string; keyCode?: number }): boolean {
  if (e.key === "GroupSeparator" || e.key === GS) return true;
  if (e.ctrlKey && (e.key === "]" || e.code === "BracketRight")) return true;
  if (e.key === "F8") return true;
  return e.keyCode === 29;
}

export type ScanReading = Gs1Result & { normalised: string };

/** Normalise and parse an element string, or a GS1 Digital Link address; `today` fixes the GS1 century window. */
export function readScan(raw: string, today?: Date | string): ScanReading {
  const normalised = normaliseScan(raw);
  if (isWebAddress(normalised)) return { ...parseGs1DigitalLink(normalised, today), normalised };
  return { ...parseGs1(normalised, today), normalised };
}

export type CameraSymbology = "code128" | "datamatrix" | "qr" | "other";

/**
 * What the camera read. A Code 128 is GS1-128 only when the reader met FNC1 first (it then
 * prefixes "]C1" and turns each later FNC1 into ASCII 29); without it the separators between
 * variable fields are lost, and a lot would swallow the serial after it: refused, not guessed.
 * DataMatrix and QR keep ASCII 29 themselves; a QR may carry a Digital Link address instead.
 */
export function readCameraText(text: string, symbology: CameraSymbology, today?: Date | string): ScanReading {
  if (symbology === "code128" && !text.startsWith("]C1")) {
    return { elements: [], errors: ["not a GS1-128 label: its group separators cannot be read"], normalised: normaliseScan(text) };
  }
  return readScan(text, today);
}
