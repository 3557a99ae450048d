// The QR's target: the device card as a plain HTML document with no script (lib/qr/card-html.ts
// says why). No sign-in: device facts only. Counted against the address's card limit first (a
// real 429); headers (no-referrer, no-store, noindex, CSP) come from proxy.ts.
import { getRegion } from "@/lib/config/settings";
import { isLocale } from "@/lib/i18n/routing";
import { cardRequest } from "@/lib/qr/card-page";
import { deviceCardDocument, htmlResponse, invalidCardDocument, typoCardDocument } from "@/lib/qr/card-html";
import { limitCardRequest } from "@/lib/qr/card-limit";
import { openDeviceCard } from "@/lib/qr/device-card";

export const dynamic = "force-dynamic";

export async function GET(incoming: Request, { params }: { params: Promise<{ locale: string; token: string }> }) {
  const { locale, token } = await params;
  if (!isLocale(locale)) return new Response("Not found", { status: 404 });
  const limited = await limitCardRequest(incoming, locale);
  if (limited) return limited;
  const { request, viewer } = await cardRequest(incoming.headers);
  const result = await openDeviceCard({ credential: decodeURIComponent(token), request, viewer });
  if (result.kind === "invalid") return htmlResponse(invalidCardDocument(locale));
  if (result.kind === "typo") return htmlResponse(typoCardDocument(locale));
  return htmlResponse(deviceCardDocument({ card: result.card, locale, region: await getRegion(), visitHref: `/${locale}/p/${encodeURIComponent(token)}/visit` }));
}
