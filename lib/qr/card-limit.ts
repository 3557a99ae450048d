import "server-only";
// The per-address limit on the public device card and the typed passport code, counted by their
// route handlers before anything else, with a real 429. PostgreSQL-backed
// (lib/http/rate-limit.ts), so it holds across app instances.
import { limitedPage } from "@/lib/qr/card-html";
import { checkAddress, LIMITS } from "@/lib/http/rate-limit";

export const CARD_LIMIT = LIMITS.passportCard;

/** Counts this request; a 429 page when the address is over the limit, else null. */
export async function limitCardRequest(request: { headers: Headers }, locale: string): Promise<Response | null> {
  const { allowed, retryAfterSeconds } = await checkAddress(request, CARD_LIMIT);
  return allowed ? null : limitedPage(locale, retryAfterSeconds);
}
