// TOTP codes for tests and the bench, as an authenticator app would show them (RFC 6238 with
// better-auth's defaults: SHA-1, 6 digits, 30 s). The demo staff's secrets come from the seed;
// accounts a test makes register theirs here, so signing in stays one call for every test.
import * as OTPAuth from "otpauth";
import { DEMO_STAFF_TOTP } from "@/db/seed";

/** The current code for a base32 secret. */
export function totpCode(base32: string, timestamp = Date.now()): string {
  return new OTPAuth.TOTP({ secret: OTPAuth.Secret.fromBase32(base32), digits: 6, period: 30, algorithm: "SHA1" }).generate({ timestamp });
}

/** The base32 form of a raw key as better-auth keeps it. */
export function base32Of(key: string): string {
  return new OTPAuth.Secret({ buffer: new TextEncoder().encode(key).buffer as ArrayBuffer }).base32;
}

const secrets = new Map<string, string>(DEMO_STAFF_TOTP.map((x) => [x.email, x.base32]));

export function rememberTotpSecret(email: string, base32: string) {
  secrets.set(email.toLowerCase(), base32);
}

export function totpSecretFor(email: string): string | undefined {
  return secrets.get(email.toLowerCase());
}
