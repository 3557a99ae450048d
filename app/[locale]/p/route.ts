// Typing the passport code: a plain GET form, the same for everyone, so it is prerendered at
// build time for each language and served as a file (no script, no database). The typed code
// goes to /p/code.
import { locales } from "@/lib/i18n/routing";
import { htmlResponse, shortCodeDocument } from "@/lib/qr/card-html";

export const dynamic = "force-static";

export function generateStaticParams() {
  return locales.map((locale) => ({ locale }));
}

export async function GET(_request: Request, { params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  return htmlResponse(shortCodeDocument({ locale, typed: "", notice: null }));
}
