import "server-only";
import { createHash, createHmac, randomBytes } from "node:crypto";
import { env } from "@/lib/config/env";

/** A link token: 256 bits from the CSPRNG (ASVS 11.5.1), base64url. */
export function newToken(): string {
  return randomBytes(32).toString("base64url");
}

/** Only this hash of a token is stored. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/** A keyed hash of an identifier (e.g. a removed record's HRN), so logs can match it without holding it. */
export function hashIdentifier(kind: string, value: string): string {
  return createHmac("sha256", env.AUDIT_IP_SALT).update(`${kind}:${value}`).digest("hex").slice(0, 32);
}
