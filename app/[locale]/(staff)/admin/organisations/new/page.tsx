import { getTranslations } from "next-intl/server";
import { OrganisationForm } from "@/components/admin/organisation-form";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("AdminOrganisations");
  return { title: t("newTitle") };
}

export default async function NewOrganisationPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  await requirePageRole(locale, "admin");
  const t = await getTranslations("AdminOrganisations");
  return (
    <div className="flex flex-col gap-6">
      <Link href="/admin/organisations" className="text-brand underline underline-offset-4">
        {t("back")}
      </Link>
      <div>
        <h1 className="text-3xl font-bold">{t("newTitle")}</h1>
        <p className="text-ink-soft">{t("newIntro")}</p>
      </div>
      <OrganisationForm />
    </div>
  );
}
