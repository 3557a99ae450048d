import { getTranslations, setRequestLocale } from "next-intl/server";
import { TwoFactorCodeForm } from "@/components/account/two-factor-code-form";
import { Card } from "@/components/ui/card";

export async function generateMetadata() {
  const t = await getTranslations("TwoFactor");
  return { title: t("title") };
}

/** The second step of signing in; the pending sign-in lives in better-auth's short-lived cookie. */
export default async function TwoFactorPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("TwoFactor");
  return (
    <Card className="flex flex-col gap-5">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="mt-1 text-ink-soft">{t("intro")}</p>
      </div>
      <TwoFactorCodeForm />
    </Card>
  );
}
