// A typed passport code: the device card when it is right, else the form again with what was
// wrong (a typing mistake, or a code that is unknown or no longer valid: never which). Counted
// against the address's card limit first.
import { getRegion } from "@/lib/config/settings";
import { isLocale } from "@/lib/i18n/routing";
import { normaliseShortCode } from "@/lib/passport/tokens";
import { cardRequest } from "@/lib/qr/card-page";
import { cardAnswer, deviceCardDocument, htmlResponse, shortCodeDocument } from "@/lib/qr/card-html";
import { limitCardRequest } from "@/lib/qr/card-limit";
import { openDeviceCard } from "@/lib/qr/device-card";

export const dynamic = "force-dynamic";

async function answer(incoming: Request, { params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  if (!isLocale(locale)) return new Response("Not found", { status: 404 });
  const limited = await limitCardRequest(incoming, locale);
  if (limited) return limited;
  const typed = new URL(incoming.url).searchParams.get("code")?.slice(0, 40) ?? "";
  if (!typed.trim()) return htmlResponse(shortCodeDocument({ locale, typed, notice: null }));
  const { request, viewer } = await cardRequest(incoming.headers);
  const result = await openDeviceCard({ credential: typed, request, viewer });
  if (result.kind === "ok") {
    return htmlResponse(deviceCardDocument({ card: result.card, locale, region: await getRegion(), visitHref: `/${locale}/p/${normaliseShortCode(typed)}/visit` }));
  }
  return htmlResponse(shortCodeDocument({ locale, typed, notice: result.kind }));
}

export async function GET(incoming: Request, context: Parameters<typeof answer>[1]) {
  return cardAnswer(new URL(incoming.url).pathname, await answer(incoming, context));
}
