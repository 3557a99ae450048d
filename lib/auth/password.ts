// Password hashing with scrypt at OWASP's current floor (N=2^17, r=8, p=1), stronger than
// better-auth's default. Stored as scrypt$N$r$p$salt$hash (base64url).
import { randomBytes, scrypt as scryptCb, timingSafeEqual, type ScryptOptions } from "node:crypto";

const N = 2 ** 17;
const R = 8;
const P = 1;
const KEY_LENGTH = 32;

function scrypt(password: string, salt: Buffer, n: number, r: number, p: number): Promise<Buffer> {
  const options: ScryptOptions = { N: n, r, p, maxmem: 256 * 1024 * 1024 };
  return new Promise((resolve, reject) =>
    scryptCb(password.normalize("NFKC"), salt, KEY_LENGTH, options, (err, key) => (err ? reject(err) : resolve(key))),
  );
}

export async function hashPassword(password: string): Promise<string> {
  const salt = randomBytes(16);
  const key = await scrypt(password, salt, N, R, P);
  return ["scrypt", N, R, P, salt.toString("base64url"), key.toString("base64url")].join("$");
}

export async function verifyPassword({ hash, password }: { hash: string; password: string }): Promise<boolean> {
  const parts = hash.split("$");
  if (parts.length !== 6 || parts[0] !== "scrypt") return false;
  const [, n, r, p, salt, expected] = parts;
  const want = Buffer.from(expected, "base64url");
  const got = await scrypt(password, Buffer.from(salt, "base64url"), Number(n), Number(r), Number(p));
  return got.length === want.length && timingSafeEqual(got, want);
}

// A short list of the passwords most often tried (ASVS 6.2.4); checked case-insensitively.
const COMMON = new Set([
  "password", "password1", "password123", "123456789012", "qwertyuiop12", "iloveyou1234",
  "letmein12345", "welcome12345", "changeme1234", "administrator", "passwordpassword",
  "123456123456", "abc123abc123", "qwerty123456", "111111111111", "000000000000",
]);

export const PASSWORD_MIN_LENGTH = 12;

export function passwordProblem(password: string): "too_short" | "too_common" | null {
  if (password.length < PASSWORD_MIN_LENGTH) return "too_short";
  if (COMMON.has(password.toLowerCase())) return "too_common";
  return null;
}
