import "server-only";
// The names of Caddis's auth cookies, for better-auth (lib/auth/index.ts) and for proxy.ts's cheap
// "is there a session cookie at all" check. Served over https they carry the __Host- prefix:
// Secure, Path=/, no Domain, so no other site or subdomain can set or read them (ASVS 5.0.0 3.3.1).
export const COOKIE_PREFIX_HTTP = "caddis";
export const COOKIE_PREFIX_HTTPS = "__Host-caddis";

export function cookiePrefixFor(appUrl: string): string {
  return appUrl.startsWith("https://") ? COOKIE_PREFIX_HTTPS : COOKIE_PREFIX_HTTP;
}

export function sessionCookieNameFor(appUrl: string): string {
  return `${cookiePrefixFor(appUrl)}.session_token`;
}
