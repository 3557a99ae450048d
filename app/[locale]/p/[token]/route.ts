// The QR's target: the device card as a plain HTML document with no script (lib/qr/card-html.ts
// says why). No sign-in: device facts only. One database round trip for a QR token: the
// address's card limit (a real 429), the lookup, the card and the audit event together
// (lib/qr/device-card.ts openCardAtAddress). Headers (no-referrer, no-store, noindex, CSP) come
// from proxy.ts.
import { isLocale } from "@/lib/i18n/routing";
import { cardRequest } from "@/lib/qr/card-page";
import { cardAnswer, deviceCardDocument, htmlResponse, invalidCardDocument, limitedPage, typoCardDocument } from "@/lib/qr/card-html";
import { openCardAtAddress } from "@/lib/qr/device-card";

export const dynamic = "force-dynamic";

async function answer(incoming: Request, { params }: { params: Promise<{ locale: string; token: string }> }) {
  const { locale, token } = await params;
  if (!isLocale(locale)) return new Response("Not found", { status: 404 });
  const { request, viewer } = await cardRequest(incoming.headers);
  const result = await openCardAtAddress({ credential: decodeURIComponent(token), request, viewer });
  if (result.kind === "limited") return limitedPage(locale, result.retryAfterSeconds);
  if (result.kind === "invalid") return htmlResponse(invalidCardDocument(locale));
  if (result.kind === "typo") return htmlResponse(typoCardDocument(locale));
  return htmlResponse(deviceCardDocument({ card: result.card, locale, region: result.region, visitHref: `/${locale}/p/${encodeURIComponent(token)}/visit` }));
}

export async function GET(incoming: Request, context: Parameters<typeof answer>[1]) {
  return cardAnswer(new URL(incoming.url).pathname, await answer(incoming, context));
}
