import { getTranslations } from "next-intl/server";
import { YourSessions } from "@/components/account/your-sessions";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("Sessions");
  return { title: t("title") };
}

export default async function StaffSessionsPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin", "clinician");
  const t = await getTranslations("Sessions");
  return <YourSessions viewer={viewer} backHref="/account" backLabel={t("backToAccount")} />;
}
