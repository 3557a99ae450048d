import { getTranslations } from "next-intl/server";
import { SessionsList } from "@/components/account/sessions-list";
import { requirePageRole } from "@/lib/auth/permissions";
import { listSessionsFor } from "@/lib/auth/sessions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("Sessions");
  return { title: t("title") };
}

export default async function StaffSessionsPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin", "clinician");
  const t = await getTranslations("Sessions");
  const sessions = await listSessionsFor(viewer);
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <Link href="/account" className="text-brand underline underline-offset-4">
        {t("backToAccount")}
      </Link>
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      <SessionsList sessions={sessions} />
    </div>
  );
}
