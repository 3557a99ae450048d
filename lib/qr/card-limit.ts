import "server-only";
// The per-address limit on the public device card and the short-code page, applied in proxy.ts
// so the answer can be a real 429 (a page cannot choose its status). PostgreSQL-backed
// (lib/http/rate-limit.ts), so it holds across app instances. The proxy loads this module only
// on the card's paths (lib/http/secret-headers isCardPath).
import { translatorFor } from "@/lib/i18n/catalogues";
import { directionOf, isLocale } from "@/lib/i18n/routing";
import { checkAddress, LIMITS } from "@/lib/http/rate-limit";

export const CARD_LIMIT = LIMITS.passportCard;

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A plain page, in the visitor's language and English, with status 429 and Retry-After. */
export function limitedPage(locale: string, retryAfterSeconds: number): Response {
  const loc = isLocale(locale) ? locale : "en";
  const blocks = (loc === "en" ? ["en"] : [loc, "en"]).map((l) => {
    const t = translatorFor(l, "DeviceCard");
    return `<section lang="${l}" dir="${directionOf(l)}"><h1>${escapeHtml(t("limitedTitle"))}</h1><p>${escapeHtml(t("limitedBody"))}</p></section>`;
  });
  const html = `<!doctype html><html lang="${loc}" dir="${directionOf(loc)}"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta name="robots" content="noindex"><title>Caddis</title><style>body{font-family:system-ui,sans-serif;font-size:1.125rem;line-height:1.5;max-width:36rem;margin:2rem auto;padding:0 1.25rem;color:#1c2321;background:#fbf8f2}h1{font-size:1.5rem}section+section{border-top:1px solid #b9b3a8;margin-top:1.5rem}</style></head><body>${blocks.join("")}</body></html>`;
  return new Response(html, {
    status: 429,
    headers: { "content-type": "text/html; charset=utf-8", "retry-after": String(retryAfterSeconds) },
  });
}

/** Counts this request; a 429 page when the address is over the limit, else null. */
export async function limitCardRequest(request: { headers: Headers }, locale: string): Promise<Response | null> {
  const { allowed, retryAfterSeconds } = await checkAddress(request, CARD_LIMIT);
  return allowed ? null : limitedPage(locale, retryAfterSeconds);
}
