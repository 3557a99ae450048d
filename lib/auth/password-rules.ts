// The one set of password rules, for the server and every form that sets a password (browser-safe:
// no Node.js imports). A short list of the passwords most often tried (ASVS 6.2.4), checked
// case-insensitively.
const COMMON = new Set([
  "password", "password1", "password123", "123456789012", "qwertyuiop12", "iloveyou1234",
  "letmein12345", "welcome12345", "changeme1234", "administrator", "passwordpassword",
  "123456123456", "abc123abc123", "qwerty123456", "111111111111", "000000000000",
]);

export const PASSWORD_MIN_LENGTH = 12;
export const PASSWORD_MAX_LENGTH = 256;

export type PasswordProblem = "password_too_short" | "password_too_long" | "password_too_common";

/** The problem with a new password, as the error code every form and route uses, or null. */
export function passwordProblem(password: string): PasswordProblem | null {
  if (password.length < PASSWORD_MIN_LENGTH) return "password_too_short";
  if (password.length > PASSWORD_MAX_LENGTH) return "password_too_long";
  if (COMMON.has(password.toLowerCase())) return "password_too_common";
  return null;
}
