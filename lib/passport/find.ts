import "server-only";
// Finding the current passport by its QR token or typed short code. Apart from the rest of
// lib/passport (issuing, the booklet PDF, object storage, e-mail), so the public device card's
// route loads none of those (its first scan after a start took about 1 s with them, 0.2 s without).
import { findPassportRowByShortCodeHash, findPassportRowByTokenHash } from "@/db/queries/passports";
import { hashesEqual, hashShortCode, hashToken, isWellFormedShortCode, isWellFormedToken } from "./tokens";

export type FoundPassport = { passportId: string; patientId: string; issuedAt: Date };

/**
 * The current passport a QR token opens, or null (malformed, unknown or revoked). The lookup
 * goes by the SHA-256 of the token; the stored and computed hashes are then compared in
 * constant time, so response timing says nothing about how much of a guess matched.
 */
export async function findPassportByToken(token: string): Promise<FoundPassport | null> {
  if (typeof token !== "string" || !isWellFormedToken(token)) return null;
  const hash = hashToken(token);
  const row = await findPassportRowByTokenHash({ tokenHash: hash });
  if (!row || !hashesEqual(row.tokenHash, hash) || row.revokedAt) return null;
  return { passportId: row.id, patientId: row.patientId, issuedAt: row.issuedAt };
}

/** The same for the short code a visiting clinician types (callers must rate-limit it). */
export async function findPassportByShortCode(code: string): Promise<FoundPassport | null> {
  if (typeof code !== "string" || !isWellFormedShortCode(code)) return null; // a typo (readShortCode) or not a code
  const hash = hashShortCode(code);
  const row = await findPassportRowByShortCodeHash({ shortCodeHash: hash });
  if (!row || !hashesEqual(row.shortCodeHash, hash) || row.revokedAt) return null;
  return { passportId: row.id, patientId: row.patientId, issuedAt: row.issuedAt };
}
