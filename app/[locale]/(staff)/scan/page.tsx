import { getTranslations } from "next-intl/server";
import { PassportScanner } from "@/components/scan/passport-scanner";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("Scan");
  return { title: t("title") };
}

export default async function ScanPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  await requirePageRole(locale, "clinician");
  const t = await getTranslations("Scan");
  return (
    <div className="flex flex-col gap-4">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      <PassportScanner />
    </div>
  );
}
