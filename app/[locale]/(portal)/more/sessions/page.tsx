import { getTranslations } from "next-intl/server";
import { SessionsList } from "@/components/account/sessions-list";
import { requirePageRole } from "@/lib/auth/permissions";
import { listSessionsFor } from "@/lib/auth/sessions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("Sessions");
  return { title: t("title") };
}

export default async function PortalSessionsPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("Sessions");
  const sessions = await listSessionsFor(viewer);
  return (
    <div className="flex flex-col gap-5">
      <Link href="/more/security" className="text-brand underline underline-offset-4">
        {t("backToSecurity")}
      </Link>
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <SessionsList sessions={sessions} large />
    </div>
  );
}
