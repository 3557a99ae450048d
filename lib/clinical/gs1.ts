import { daysInMonth, formatIsoDate, isRealDate, toDayNumber, type DateInput } from "./dates";
import { isValidGtin } from "./gtin";

/**
 * A small GS1 element-string parser for catheter packaging labels. Written here because
 * the small npm parsers we tried skip the check digit and mishandle day 00 and 29 February.
 * Source: GS1 General Specifications (application identifiers, 7.9.1 check digit, 7.12 century).
 */

export interface Gs1Element {
  ai: string;
  value: string;
}

export interface Gs1Result {
  /** 14 digits; only set when the check digit is right. */
  gtin?: string;
  lot?: string;
  /** YYYY-MM-DD; day 00 on the label becomes the last day of the month. */
  expiry?: string;
  productionDate?: string;
  serial?: string;
  /** Every element read, in order, as written. */
  elements: Gs1Element[];
  /** English messages, each starting with the AI concerned ("AI 17: …"). Empty when all is well. */
  errors: string[];
}

type AiKind = "numeric" | "date" | "text";
interface AiSpec {
  /** Fixed length of the data, or the maximum for a variable field. */
  length: number;
  fixed: boolean;
  kind: AiKind;
}

/** The AIs a medical-device label carries, plus common logistics ones so parsing can continue. */
export const GS1_AIS: Record<string, AiSpec> = {
  "00": { length: 18, fixed: true, kind: "numeric" },
  "01": { length: 14, fixed: true, kind: "numeric" },
  "02": { length: 14, fixed: true, kind: "numeric" },
  "10": { length: 20, fixed: false, kind: "text" },
  "11": { length: 6, fixed: true, kind: "date" },
  "12": { length: 6, fixed: true, kind: "date" },
  "13": { length: 6, fixed: true, kind: "date" },
  "15": { length: 6, fixed: true, kind: "date" },
  "16": { length: 6, fixed: true, kind: "date" },
  "17": { length: 6, fixed: true, kind: "date" },
  "20": { length: 2, fixed: true, kind: "numeric" },
  "21": { length: 20, fixed: false, kind: "text" },
  "22": { length: 20, fixed: false, kind: "text" },
  "30": { length: 8, fixed: false, kind: "numeric" },
  "37": { length: 8, fixed: false, kind: "numeric" },
  "240": { length: 30, fixed: false, kind: "text" },
  "241": { length: 30, fixed: false, kind: "text" },
  "250": { length: 30, fixed: false, kind: "text" },
  "251": { length: 30, fixed: false, kind: "text" },
  "400": { length: 30, fixed: false, kind: "text" },
  "710": { length: 20, fixed: false, kind: "text" },
  "711": { length: 20, fixed: false, kind: "text" },
  "712": { length: 20, fixed: false, kind: "text" },
  "713": { length: 20, fixed: false, kind: "text" },
  "714": { length: 20, fixed: false, kind: "text" },
  "715": { length: 20, fixed: false, kind: "text" },
};

const GS = "\u001d";
/** Symbology identifiers a scanner may prepend: ]C1 (GS1-128), ]d2 (DataMatrix), ]Q3 (QR), ]e0 (DataBar), ]J1. */
const SYMBOLOGY_PREFIX = /^\][A-Za-z][0-9A-Za-z]/;
/** GS1 AI encodable character set 82. */
const CSET82 = /^[!"%&'()*+,\-./0-9:;<=>?A-Z_a-z]*$/;

function findAi(text: string, at: number): string | undefined {
  for (const len of [2, 3, 4]) {
    const ai = text.slice(at, at + len);
    if (GS1_AIS[ai]) return ai;
  }
  return undefined;
}

/**
 * YYMMDD → YYYY-MM-DD, or an error message. Day 00 means the last day of the month.
 * Century (GS1 GS 7.12): difference = YY − current YY; ≥ 51 → previous century,
 * ≤ −50 → next century, else this century.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function gs1Date(yymmdd: string, today?: DateInput): string | { error: string } {
  if (!/^\d{6}$/.test(yymmdd)) return { error: "date must be six digits YYMMDD" };
  const yy = Number(yymmdd.slice(0, 2));
  const mm = Number(yymmdd.slice(2, 4));
  let dd = Number(yymmdd.slice(4, 6));
  const current = new Date(toDayNumber("today", today) * 86_400_000).getUTCFullYear();
  const currentYy = current % 100;
  let century = current - currentYy;
  const diff = yy - currentYy;
  if (diff >= 51) century -= 100;
  else if (diff <= -50) century += 100;
  const year = century + yy;
  if (mm < 1 || mm > 12) return { error: `month ${yymmdd.slice(2, 4)} does not exist` };
  if (dd === 0) dd = daysInMonth(year, mm);
  if (!isRealDate(year, mm, dd)) return { error: `${formatIsoDate(year, mm, dd)} is not a real date` };
  return formatIsoDate(year, mm, dd);
}

function splitBracketed(text: string, errors: string[]): Gs1Element[] {
  const out: Gs1Element[] = [];
  const re = /\((\d{2,4})\)([^(]*)/g;
  const head = text.slice(0, text.indexOf("("));
  if (head.trim() !== "") errors.push(`text before the first AI ignored: "${head.trim()}"`);
  let m: RegExpExecArray | null;
  while ((m = re.exec(text)) !== null) out.push({ ai: m[1], value: m[2].replace(/\u001d/g, "").replace(/\s+$/, "") });
  return out;
}

function splitElementString(text: string, errors: string[]): Gs1Element[] {
  const out: Gs1Element[] = [];
  let i = 0;
  while (i < text.length) {
    if (text[i] === GS) {
      i++;
      continue;
    }
    const ai = findAi(text, i);
    if (!ai) {
      errors.push(`unknown or unsupported AI at "${text.slice(i, i + 4)}"; the rest was not read`);
      break;
    }
    const spec = GS1_AIS[ai];
    const start = i + ai.length;
    let end: number;
    if (spec.fixed) {
      end = start + spec.length;
      // A fixed field may still be followed by a GS some encoders add.
    } else {
      const gs = text.indexOf(GS, start);
      end = gs === -1 ? text.length : gs;
    }
    out.push({ ai, value: text.slice(start, end) });
    i = end;
  }
  return out;
}

/**
 * Parse a GS1 element string as a scanner types it (FNC1 as ASCII 29, optional symbology
 * prefix) or in the printed bracket form "(01)…(17)…(10)…". Label problems never throw: they
 * are listed in `errors`, and a field with an error is left out of the result (an invalid
 * `today` does throw ClinicalInputError).
 * `today` fixes the century window (default: now).
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function parseGs1(text: string, today?: DateInput): Gs1Result {
  const errors: string[] = [];
  const result: Gs1Result = { elements: [], errors };
  if (typeof text !== "string" || text.trim() === "") {
    errors.push("nothing to read");
    return result;
  }
  let body = text.replace(/[\r\n]+$/, "").replace(/^\s+/, "");
  body = body.replace(SYMBOLOGY_PREFIX, "");
  // Bracket form only when the text does not start as an element string, so a "(" inside a lot is safe.
  const bracketed = /^\(\d{2,4}\)/.test(body) || (!/^[\d\u001d]/.test(body) && /\(\d{2,4}\)/.test(body));
  const elements = bracketed ? splitBracketed(body, errors) : splitElementString(body, errors);
  result.elements = elements;

  for (const { ai, value } of elements) {
    const spec = GS1_AIS[ai];
    if (!spec) {
      errors.push(`AI ${ai}: unknown or unsupported AI`);
      continue;
    }
    if (spec.fixed ? value.length !== spec.length : value.length < 1 || value.length > spec.length) {
      errors.push(
        spec.fixed
          ? `AI ${ai}: must be ${spec.length} characters, found ${value.length}`
          : `AI ${ai}: must be 1 to ${spec.length} characters, found ${value.length} (a missing group separator?)`,
      );
      continue;
    }
    if (spec.kind !== "text" && !/^\d+$/.test(value)) {
      errors.push(`AI ${ai}: must be digits only`);
      continue;
    }
    if (spec.kind === "text" && !CSET82.test(value)) {
      errors.push(`AI ${ai}: contains a character GS1 does not allow`);
      continue;
    }
    let date: string | undefined;
    if (spec.kind === "date") {
      const parsed = gs1Date(value, today);
      if (typeof parsed !== "string") {
        errors.push(`AI ${ai}: ${parsed.error}`);
        continue;
      }
      date = parsed;
    }
    const duplicate = (field: keyof Gs1Result, v: string) => {
      const existing = result[field];
      if (existing !== undefined && existing !== v) {
        errors.push(`AI ${ai}: appears twice with different values`);
        return true;
      }
      return false;
    };
    switch (ai) {
      case "01":
        if (!isValidGtin(value)) errors.push(`AI 01: check digit is wrong (${value})`);
        else if (!duplicate("gtin", value)) result.gtin = value;
        break;
      case "10":
        if (!duplicate("lot", value)) result.lot = value;
        break;
      case "11":
        if (!duplicate("productionDate", date!)) result.productionDate = date;
        break;
      case "17":
        if (!duplicate("expiry", date!)) result.expiry = date;
        break;
      case "21":
        if (!duplicate("serial", value)) result.serial = value;
        break;
    }
  }
  return result;
}
