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

/** Each symbol drawn uniformly (randomInt rejects biased values, unlike `byte % 30`). */
export function generateShortCode(): string {
  let code = "";
  for (let i = 0; i < SHORT_CODE_LENGTH; i++) code += SHORT_CODE_ALPHABET[randomInt(SHORT_CODE_ALPHABET.length)];
  return code;
}

/** ABCDEFGHJKMN → ABCD-EFGH-JKMN */
export function formatShortCode(code: string): string {
  return normaliseShortCode(code).replace(/(.{4})(?=.)/g, "$1-");
}

/** What a person typed → the canonical code: case, spaces and dashes ignored. */
export function normaliseShortCode(typed: string): string {
  return normaliseActivationCode(typed);
}

export function isWellFormedShortCode(code: string): boolean {
  const c = normaliseShortCode(code);
  return c.length === SHORT_CODE_LENGTH && [...c].every((ch) => SHORT_CODE_ALPHABET.includes(ch));
}

export function sha256Hex(value: string): string {
  return createHash("sha256").update(value, "utf8").digest("hex");
}

export function hashToken(token: string): string {
  return sha256Hex(token);
}

/** Keyed like the activation codes, with its own prefix so the two can never be confused. */
export function hashShortCode(code: string): string {
  return createHmac("sha256", authSecret()).update(`passport:${normaliseShortCode(code)}`).digest("hex");
}

/** Constant-time comparison of two hex digests of equal length. */
export function hashesEqual(a: string, b: string): boolean {
  const x = Buffer.from(a, "hex");
  const y = Buffer.from(b, "hex");
  return x.length === y.length && x.length > 0 && timingSafeEqual(x, y);
}
