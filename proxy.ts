// Kept cheap on purpose: locale routing, a per-request CSP nonce, a redirect to sign-in when
// no session cookie is present, and the secret-URL pages' headers. No database: the device
// card's per-address limit is counted by its route handlers. It never decides authorisation:
// pages and handlers do.
import createMiddleware from "next-intl/middleware";
import { NextResponse, type NextRequest } from "next/server";
import { sessionCookieNameFor } from "@/lib/auth/cookies";
import { locales, routing } from "@/lib/i18n/routing";
import { withSecretUrlHeaders } from "@/lib/http/secret-headers";

const intl = createMiddleware(routing);
const sessionCookieName = sessionCookieNameFor(process.env.APP_URL ?? "http://localhost:3000");

const signedInAreas = new RegExp(`^/(${locales.join("|")})/(caseload|patients|admin|scan|today|my-catheter|check-in|diary|help|people|learn|more|account|home)(/|$)`);

function contentSecurityPolicy(nonce: string) {
  const dev = process.env.NODE_ENV !== "production";
  const s3 = process.env.S3_PUBLIC_ENDPOINT ?? process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569";
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self' ${new URL(s3).origin}`,
    "media-src 'self' blob:",
    "worker-src 'self' blob:",
    "manifest-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export default async function proxy(request: NextRequest) {
  const { pathname } = request.nextUrl;
  const hasSession = request.cookies.has(sessionCookieName);
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const csp = contentSecurityPolicy(nonce);
  if (signedInAreas.test(pathname) && !hasSession) {
    const locale = pathname.split("/")[1];
    const url = request.nextUrl.clone();
    url.pathname = `/${locale}/sign-in`;
    url.search = "";
    // The redirect is an answer too: it carries the same policy as a page (security-headers test).
    const redirect = NextResponse.redirect(url);
    redirect.headers.set("Content-Security-Policy", csp);
    return redirect;
  }
  // next-intl forwards the request headers, so the nonce reaches the page renderer.
  request.headers.set("x-nonce", nonce);
  request.headers.set("Content-Security-Policy", csp);
  const response = intl(request);
  response.headers.set("Content-Security-Policy", csp);
  return withSecretUrlHeaders(pathname, response);
}

// Not the device card (/<locale>/p, /<locale>/p/<token>, /<locale>/p/code): those route
// handlers answer plain documents with their own headers (lib/qr/card-html cardAnswer), so a
// doorstep scan costs no middleware. The visit-access page under the card stays here.
export const config = {
  matcher: ["/((?!api|_next|.*\\..*|[a-z]{2}/p(?:/[^/]+)?/?$).*)"],
};
