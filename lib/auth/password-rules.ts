// Password rules shared by the server and the client forms (no Node.js imports here).
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
