// Typing the passport code: a plain GET form as an HTML document with no script, so it works on
// any phone; a right code shows the device card itself. Limited per address in proxy.ts like
// the card.
import { isLocale } from "@/lib/i18n/routing";
import { normaliseShortCode } from "@/lib/passport";
import { cardRequest } from "@/lib/qr/card-page";
import { deviceCardDocument, htmlResponse, shortCodeDocument } from "@/lib/qr/card-html";
import { openDeviceCard } from "@/lib/qr/device-card";

export const dynamic = "force-dynamic";

export async function GET(incoming: Request, { params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  if (!isLocale(locale)) return new Response("Not found", { status: 404 });
  const typed = new URL(incoming.url).searchParams.get("code")?.slice(0, 40) ?? "";
  if (!typed.trim()) return htmlResponse(shortCodeDocument({ locale, typed, notice: null }));
  const { request, viewer } = await cardRequest(incoming.headers);
  const result = await openDeviceCard({ credential: typed, request, viewer });
  if (result.kind === "ok") {
    return htmlResponse(deviceCardDocument({ card: result.card, locale, visitHref: `/${locale}/p/${normaliseShortCode(typed)}/visit` }));
  }
  return htmlResponse(shortCodeDocument({ locale, typed, notice: result.kind }));
}
