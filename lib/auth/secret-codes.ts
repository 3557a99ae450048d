import "server-only";
// Secrets handed to people: activation codes (typed by hand) and carer-invitation tokens (in a
// link). Both from the CSPRNG; only keyed hashes are stored, never the values.
import { createHash, createHmac, randomBytes, randomInt } from "node:crypto";
import { authSecret } from "@/lib/config/env";

// No 0/O, 1/I/L or U/V confusion: 30 symbols that read back unambiguously.
export const CODE_ALPHABET = "23456789ABCDEFGHJKMNPQRSTVWXYZ";
export const CODE_LENGTH = 12;
/** log2(30) × 12 ≈ 58.9 bits: with 10 tries per 15 min per address and 14 days, unguessable. */
export const CODE_BITS = Math.log2(CODE_ALPHABET.length) * CODE_LENGTH;
export const ACTIVATION_DAYS = 14;
export const CARER_INVITE_DAYS = 14;

/** A fresh activation code, grouped for reading aloud: "ABCD-EFGH-JKMN". */
export function newActivationCode(): string {
  let raw = "";
  for (let i = 0; i < CODE_LENGTH; i++) raw += CODE_ALPHABET[randomInt(CODE_ALPHABET.length)];
  return raw.match(/.{1,4}/g)!.join("-");
}

/** What a person typed, reduced to the code's symbols (spaces, dashes and case ignored). */
export function normaliseActivationCode(typed: string): string {
  return typed.toUpperCase().replace(/[^0-9A-Z]/g, "");
}

/** HMAC, not a plain hash: 59 bits could be searched offline if the table leaked. */
export function hashActivationCode(typed: string): string {
  return createHmac("sha256", authSecret()).update(`activation:${normaliseActivationCode(typed)}`).digest("hex");
}

/** A 256-bit token for a carer-invitation link (ASVS 11.5.1). */
export function newInviteToken(): string {
  return randomBytes(32).toString("base64url");
}

export function hashInviteToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}
