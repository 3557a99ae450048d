import "server-only";
// Passport secrets. The QR token is 32 bytes from the operating system's CSPRNG (256 bits,
// ASVS 11.5.1 asks for ≥ 128); the short code is for a visiting clinician to type, drawn like
// the portal's activation codes (lib/secret-codes). Only hashes of either are ever stored:
// SHA-256 for the token, an HMAC for the short code (59 bits could be searched offline).
import { createHash, createHmac, randomBytes, randomInt, timingSafeEqual } from "node:crypto";
import { authSecret } from "@/lib/config/env";
import { CODE_ALPHABET, CODE_LENGTH, normaliseActivationCode } from "@/lib/auth/secret-codes";

/** No 0/O, 1/I/L or U: easy to read aloud and to type. 30 symbols (the activation codes' own). */
export const SHORT_CODE_ALPHABET = CODE_ALPHABET;
/** 12 symbols of 30 → 58.9 bits (10 would give only 49.1). */
export const SHORT_CODE_LENGTH = CODE_LENGTH;
export const TOKEN_BYTES = 32;

/** 32 random bytes, base64url without padding: 43 characters. */
export function generateToken(): string {
  return randomBytes(TOKEN_BYTES).toString("base64url");
}

export function isWellFormedToken(token: string): boolean {
  return /^[A-Za-z0-9_-]{43}$/.test(token);
}

/**
 * Luhn mod 30 over the 12 random symbols: one more symbol that catches any single mistyped
 * symbol and almost every swap of two neighbours, so a typo is told apart from a code that does
 * not exist. It carries no secret: the 12 random symbols are all that is hashed and looked up.
 */
export function shortCodeCheckCharacter(code12: string): string {
  const n = SHORT_CODE_ALPHABET.length;
  let sum = 0;
  [...code12].reverse().forEach((ch, i) => {
    let v = SHORT_CODE_ALPHABET.indexOf(ch);
    if (i % 2 === 0) {
      v *= 2;
      v = Math.floor(v / n) + (v % n);
    }
    sum += v;
  });
  return SHORT_CODE_ALPHABET[(n - (sum % n)) % n];
}

/** Each symbol drawn uniformly (randomInt rejects biased values, unlike `byte % 30`), then the check symbol. */
export function generateShortCode(): string {
  let code = "";
  for (let i = 0; i < SHORT_CODE_LENGTH; i++) code += SHORT_CODE_ALPHABET[randomInt(SHORT_CODE_ALPHABET.length)];
  return code + shortCodeCheckCharacter(code);
}

/** ABCDEFGHJKMNP → ABCD-EFGH-JKMNP (the check symbol ends the last group). */
export function formatShortCode(code: string): string {
  return normaliseShortCode(code).replace(/^(.{4})(.{4})(.+)$/, "$1-$2-$3");
}

export type ShortCodeReading =
  /** The 12 random symbols to look up (a code from before the check symbol has only these). */
  | { kind: "code"; symbols: string }
  /** Well formed but the check symbol does not match: a typing mistake. */
  | { kind: "typo" }
  | { kind: "malformed" };

export function readShortCode(typed: string): ShortCodeReading {
  const c = normaliseShortCode(typed);
  if (![...c].every((ch) => SHORT_CODE_ALPHABET.includes(ch))) return { kind: "malformed" };
  if (c.length === SHORT_CODE_LENGTH) return { kind: "code", symbols: c };
  if (c.length !== SHORT_CODE_LENGTH + 1) return { kind: "malformed" };
  const symbols = c.slice(0, SHORT_CODE_LENGTH);
  return shortCodeCheckCharacter(symbols) === c[SHORT_CODE_LENGTH] ? { kind: "code", symbols } : { kind: "typo" };
}

/** What a person typed → the canonical code: case, spaces and dashes ignored. */
export function normaliseShortCode(typed: string): string {
  return normaliseActivationCode(typed);
}

export function isWellFormedShortCode(code: string): boolean {
  return readShortCode(code).kind === "code";
}

export function sha256Hex(value: string): string {
  return createHash("sha256").update(value, "utf8").digest("hex");
}

export function hashToken(token: string): string {
  return sha256Hex(token);
}

/**
 * Keyed like the activation codes, with its own prefix so the two can never be confused. Only the
 * 12 random symbols are hashed, so codes printed before the check symbol existed still open.
 */
export function hashShortCode(code: string): string {
  return createHmac("sha256", authSecret()).update(`passport:${normaliseShortCode(code).slice(0, SHORT_CODE_LENGTH)}`).digest("hex");
}

/** Constant-time comparison of two hex digests of equal length. */
export function hashesEqual(a: string, b: string): boolean {
  const x = Buffer.from(a, "hex");
  const y = Buffer.from(b, "hex");
  return x.length === y.length && x.length > 0 && timingSafeEqual(x, y);
}
