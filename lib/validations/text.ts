// Text people type. PostgreSQL refuses NUL in text, and control characters have no place in a
// record; bidirectional overrides and isolates can make a label read backwards on screen
// ("FUZZ\u202Eexe.png" shown as "FUZZgnp.exe"). Messages are codes (Errors.control_character…).
import { z } from "zod";

/**
 * C0 controls except tab, line feed, carriage return and the group separator; DEL; C1 controls.
 * The group separator (ASCII 29) is how a scanner marks the end of a GS1 field: the scanned UDI
 * keeps it. Names and labels refuse it too (singleLine).
 */
export const CONTROL_CHARACTERS = /[\u0000-\u0008\u000B\u000C\u000E-\u001C\u001E\u001F\u007F-\u009F]/;
/** Line breaks, tabs and every other control: fine in notes (the first two), never in a name or a label. */
export const LINE_CHARACTERS = /[\u0000-\u001F\u007F-\u009F\u2028\u2029]/;
/** Embeddings, overrides and isolates (LRE…RLO, LRI…PDI). The marks LRM, RLM and ALM stay allowed. */
export const BIDI_CONTROLS = /[\u202A-\u202E\u2066-\u2069]/;

/**
 * Every string in a parsed body or query with a control character, by its path ("note",
 * "items.0.label"). The one check every route handler's input goes through (lib/http/validate).
 */
export function controlCharacterPaths(value: unknown, path: string[] = [], out: string[] = [], depth = 0): string[] {
  if (depth > 64 || out.length > 500) return out;
  if (typeof value === "string") {
    if (CONTROL_CHARACTERS.test(value)) out.push(path.length ? path.join(".") : "_form");
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => controlCharacterPaths(v, [...path, String(i)], out, depth + 1));
  } else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) controlCharacterPaths(v, [...path, k], out, depth + 1);
  }
  return out;
}

/** A name or a label: one line, no control characters, no bidirectional overrides. */
export function singleLine(s: z.ZodString) {
  return s
    .refine((v) => !LINE_CHARACTERS.test(v), { error: "one_line" })
    .refine((v) => !BIDI_CONTROLS.test(v), { error: "bidi_control" });
}

/** Notes: line breaks and tabs allowed, bidirectional overrides not. */
export function multiLine(s: z.ZodString) {
  return s.refine((v) => !BIDI_CONTROLS.test(v), { error: "bidi_control" });
}
