import { getTranslations, setRequestLocale } from "next-intl/server";
import { DeviceCardView, InvalidPassport, MistypedCode } from "@/components/device-card/device-card-view";
import { buttonClass } from "@/components/ui/button";
import { normaliseShortCode } from "@/lib/passport";
import { cardRequest } from "@/lib/qr/card-page";
import { openDeviceCard } from "@/lib/qr/device-card";

type Params = { locale: string };

export async function generateMetadata({ params }: { params: Promise<Params> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale: locale as "en", namespace: "DeviceCard" });
  return { title: t("codeTitle"), robots: { index: false, follow: false } };
}

// Typing the passport code: a plain GET form, so it works without JavaScript. Limited per
// address in proxy.ts like the card itself.
export default async function ShortCodePage({ params, searchParams }: { params: Promise<Params>; searchParams: Promise<{ code?: string | string[] }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const raw = (await searchParams).code;
  const typed = (Array.isArray(raw) ? raw[0] : raw)?.slice(0, 40) ?? "";
  const t = await getTranslations("DeviceCard");
  let notice = null;
  if (typed.trim()) {
    const { request, viewer } = await cardRequest();
    const result = await openDeviceCard({ credential: typed, request, viewer });
    if (result.kind === "ok") {
      return <DeviceCardView card={result.card} locale={locale} visitHref={`/${locale}/p/${normaliseShortCode(typed)}/visit`} />;
    }
    notice = result.kind === "typo" ? <MistypedCode locale={locale} /> : <InvalidPassport locale={locale} />;
  }
  return (
    <div className="flex flex-col gap-6">
      {notice}
      <form method="get" action={`/${locale}/p`} className="flex flex-col gap-4">
        {notice ? null : <h1 className="text-3xl font-bold">{t("codeTitle")}</h1>}
        <div className="flex flex-col gap-1">
          <label htmlFor="code" className="font-bold">
            {t("codeLabel")}
          </label>
          <p id="code-hint" className="text-ink-soft">
            {t("codeHint")}
          </p>
          <input
            id="code"
            name="code"
            defaultValue={typed}
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            maxLength={40}
            dir="ltr"
            aria-describedby="code-hint"
            className="tabular min-h-14 rounded-lg border-2 border-stone-line bg-paper-raised px-3 text-2xl tracking-wider text-ink"
            data-testid="code-input"
          />
        </div>
        <button type="submit" className={buttonClass("primary", "min-h-14 text-xl")}>
          {t("codeSubmit")}
        </button>
      </form>
    </div>
  );
}
