import { getTranslations } from "next-intl/server";
import { SettingsForm } from "@/components/admin/settings-form";
import { TranslationReviewsForm } from "@/components/admin/translation-reviews-form";
import { requirePageRole } from "@/lib/auth/permissions";
import { getSettings } from "@/lib/config/settings";

export async function generateMetadata() {
  const t = await getTranslations("AdminSettings");
  return { title: t("title") };
}

export default async function SettingsPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  await requirePageRole(locale, "admin");
  const t = await getTranslations("AdminSettings");
  const { translationReviews, ...settings } = await getSettings();
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      <SettingsForm initial={settings} />
      <TranslationReviewsForm initial={translationReviews} />
    </div>
  );
}
