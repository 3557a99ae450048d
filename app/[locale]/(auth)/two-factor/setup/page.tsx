import { getTranslations, setRequestLocale } from "next-intl/server";
import { redirect } from "next/navigation";
import { SetupThenHome } from "@/components/account/setup-then-home";
import { Card } from "@/components/ui/card";
import { getViewer, homePathFor } from "@/lib/auth/session";

export async function generateMetadata() {
  const t = await getTranslations("TwoFactor");
  return { title: t("setupTitle") };
}

/** Where staff of an organisation that requires two-step sign-in are sent until they set it up. */
export default async function TwoFactorSetupPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const viewer = await getViewer();
  if (!viewer) redirect(`/${locale}/sign-in`);
  if (!viewer.secondFactor || viewer.secondFactor.enabled) redirect(`/${locale}${homePathFor(viewer.role)}`);
  const t = await getTranslations("TwoFactor");
  return (
    <Card className="flex flex-col gap-5">
      <div>
        <h1 className="text-3xl font-bold">{t("setupTitle")}</h1>
        <p className="mt-1 text-ink-soft">{viewer.secondFactor.required ? t("requiredIntro") : t("optionalIntro")}</p>
      </div>
      <SetupThenHome />
    </Card>
  );
}
