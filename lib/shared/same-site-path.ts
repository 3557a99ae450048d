// A path on this site to send someone back to, or undefined: never another origin (`//host`,
// `/\host`, a scheme), so a crafted "return to" cannot make a sign-in an open redirect.
export function sameSitePath(value: string | null | undefined): string | undefined {
  if (!value || !value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return undefined;
  return value;
}
