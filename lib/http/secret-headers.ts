import "server-only";
// Pages whose address holds a secret: the passport card and its short-code page (/p/…), the
// invitation links (token in the path) and the password-reset link (token in the query). Their
// answers, redirects and 429s included, are never cached, never indexed and never sent on as a
// referrer. The one place for it: proxy.ts applies it to every response of these paths.
import { locales } from "@/lib/i18n/routing";

const locale = `(?:${locales.join("|")})`;
const secretPages = [
  new RegExp(`^/(${locale}/)?p(/|$)`),
  new RegExp(`^/(${locale}/)?(carer-invite|accept-invite)/[^/]+/?$`),
  new RegExp(`^/(${locale}/)?reset-password/?$`),
];

export function isSecretUrlPage(pathname: string): boolean {
  return secretPages.some((p) => p.test(pathname));
}

export function withSecretUrlHeaders<R extends { headers: Headers }>(pathname: string, response: R): R {
  if (!isSecretUrlPage(pathname)) return response;
  response.headers.set("Referrer-Policy", "no-referrer");
  response.headers.set("Cache-Control", "no-store");
  response.headers.set("X-Robots-Tag", "noindex");
  return response;
}

const cardPath = new RegExp(`^/${locale}/p(/[^/]+)?/?$`);

/** /<locale>/p (code entry) and /<locale>/p/<token>: the card itself, which has its own limit, not the visit-access form. */
export function isCardPath(pathname: string): boolean {
  return cardPath.test(pathname);
}
