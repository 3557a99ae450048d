// Typing the passport code: a plain GET form, the same for everyone, so it is prerendered at
// build time for each language and served as a file (no script, no database). The typed code
// goes to /p/code.
import { locales } from "@/lib/i18n/routing";
import { cardAnswer, htmlResponse, shortCodeDocument } from "@/lib/qr/card-html";

export const dynamic = "force-static";

export function generateStaticParams() {
  return locales.map((locale) => ({ locale }));
}

async function answer(_request: Request, { params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  return htmlResponse(shortCodeDocument({ locale, typed: "", notice: null }));
}

export async function GET(incoming: Request, context: Parameters<typeof answer>[1]) {
  return cardAnswer(new URL(incoming.url).pathname, await answer(incoming, context));
}
