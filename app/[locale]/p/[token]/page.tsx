import { getTranslations, setRequestLocale } from "next-intl/server";
import { DeviceCardView, InvalidPassport, MistypedCode } from "@/components/device-card/device-card-view";
import { cardRequest } from "@/lib/qr/card-page";
import { openDeviceCard } from "@/lib/qr/device-card";

type Params = { locale: string; token: string };

export async function generateMetadata({ params }: { params: Promise<Params> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale: locale as "en", namespace: "DeviceCard" });
  return { title: t("title"), robots: { index: false, follow: false } };
}

// The QR's target. No sign-in: device facts only (see components/device-card). Headers
// (no-referrer, no-store, noindex) and the per-address limit come from proxy.ts.
export default async function DeviceCardPage({ params }: { params: Promise<Params> }) {
  const { locale, token } = await params;
  setRequestLocale(locale as "en");
  const { request, viewer } = await cardRequest();
  const result = await openDeviceCard({ credential: decodeURIComponent(token), request, viewer });
  if (result.kind === "invalid") return <InvalidPassport locale={locale} />;
  if (result.kind === "typo") return <MistypedCode locale={locale} />;
  return <DeviceCardView card={result.card} locale={locale} visitHref={`/${locale}/p/${encodeURIComponent(token)}/visit`} />;
}
