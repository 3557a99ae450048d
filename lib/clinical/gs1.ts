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
  if (typeof text !== "string" || text.trim() === "") {
    errors.push("nothing to read");
    return { elements: [], errors };
  }
  let body = text.replace(/[\r\n]+$/, "").replace(/^\s+/, "");
  body = body.replace(SYMBOLOGY_PREFIX, "");
  // Bracket form only when the text does not start as an element string, so a "(" inside a lot is safe.
  const bracketed = /^\(\d{2,4}\)/.test(body) || (!/^[\d\u001d]/.test(body) && /\(\d{2,4}\)/.test(body));
  const elements = bracketed ? splitBracketed(body, errors) : splitElementString(body, errors);
  return interpret(elements, errors, today);
}

/** Checks each element (length, characters, check digit, dates) and fills the result from those that pass. */
function interpret(elements: Gs1Element[], errors: string[], today?: DateInput): Gs1Result {
  const result: Gs1Result = { elements, errors };
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

/** Key qualifiers of a GTIN in a Digital Link path, in the order the standard allows them. */
const DL_VALUE = /^(?:[A-Za-z0-9._-]|%(?:2[1256789AaBbCcFf]|3[AaBbCcDdEeFf]))*$/;
const GTIN_QUALIFIERS = ["22", "10", "21"] as const;

/**
 * A GS1 Digital Link web address → the same result as an element string, with the same check
 * digit, length and date rules. `https://<any domain>/[any path/]01/<gtin>[/22/<cpv>][/10/<lot>]
 * [/21/<serial>][?17=<yymmdd>&…]`: numeric AI codes only (the alphabetic aliases were withdrawn
 * in version 1.2); values percent-encoded; a GTIN-8, -12 or -13 is padded to 14 digits; query
 * parameters that are not AI codes (such as linkType) are ignored.
 * Source: GS1 Digital Link Standard: URI Syntax, release 1.2 (2021), sections 4 and 6 (from memory;
 * cross-checked in tests against GS1's digital-link.js).
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function parseGs1DigitalLink(uri: string, today?: DateInput): Gs1Result {
  const errors: string[] = [];
  const fail = (message: string): Gs1Result => ({ elements: [], errors: [...errors, message] });
  const m = typeof uri === "string" ? /^https?:\/\/[^/?#\s]+(\/[^?#\s]*)?(?:\?([^#\s]*))?(?:#\S*)?$/i.exec(uri.trim()) : null;
  if (!m) return fail("not a web address");
  const segments = (m[1] ?? "").split("/").filter((s) => s !== "");
  // Letters, digits, "-", "." and "_" as they are; every other character GS1 allows in a value
  // percent-encoded (and nothing else encoded), as the standard's ABNF says.
  const decode = (v: string): string | null => (DL_VALUE.test(v) ? decodeURIComponent(v) : null);
  // The GTIN is the first "01" after which the rest of the path is qualifiers in order.
  let path: Gs1Element[] | null = null;
  for (let i = 0; i + 1 < segments.length && !path; i++) {
    if (segments[i] !== "01") continue;
    const rest = segments.slice(i + 2);
    if (rest.length % 2 !== 0) continue;
    const out: Gs1Element[] = [{ ai: "01", value: segments[i + 1] }];
    let order = 0;
    let ok = true;
    for (let j = 0; j < rest.length && ok; j += 2) {
      const at = GTIN_QUALIFIERS.indexOf(rest[j] as (typeof GTIN_QUALIFIERS)[number], order);
      if (at < 0) ok = false;
      else {
        order = at + 1;
        out.push({ ai: rest[j], value: rest[j + 1] });
      }
    }
    if (ok) path = out;
  }
  if (!path) return fail("no GTIN (01) in the address, or its qualifiers are not 22, 10, 21 in that order");
  const elements: Gs1Element[] = [];
  for (const e of path) {
    const value = decode(e.value);
    if (value === null) return fail(`AI ${e.ai}: percent-encoding is broken or missing`);
    elements.push({ ai: e.ai, value: e.ai === "01" && /^(\d{8}|\d{12}|\d{13})$/.test(value) ? value.padStart(14, "0") : value });
  }
  for (const pair of (m[2] ?? "").split("&").filter(Boolean)) {
    const [k, v = ""] = pair.split("=");
    if (!/^\d{2,4}$/.test(k)) continue; // linkType and other non-AI parameters
    if (GTIN_QUALIFIERS.includes(k as (typeof GTIN_QUALIFIERS)[number]) || k === "01") {
      errors.push(`AI ${k}: belongs in the path, not the query`);
      continue;
    }
    const value = decode(v);
    if (value === null) {
      errors.push(`AI ${k}: percent-encoding is broken or missing`);
      continue;
    }
    elements.push({ ai: k, value });
  }
  return interpret(elements, errors, today);
}

/** True when the text is a web address (a Digital Link candidate) rather than an element string. */
export function isWebAddress(text: string): boolean {
  return /^\s*https?:\/\//i.test(text);
}
