import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { notFound } from "next/navigation";
import { OrganisationForm } from "@/components/admin/organisation-form";
import { Notice } from "@/components/ui/notice";
import { getManagedOrganisation } from "@/db/queries/organisations";
import { isUuid, requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";

export async function generateMetadata() {
  const t = await getTranslations("AdminOrganisations");
  return { title: t("editTitle") };
}

export default async function EditOrganisationPage({ params }: { params: Promise<{ locale: string; organisationId: string }> }) {
  const { locale, organisationId } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const org = isUuid(organisationId) ? await getManagedOrganisation({ id: organisationId, organisationIds: viewer.organisationIds }) : null;
  if (!org) notFound();
  const t = await getTranslations("AdminOrganisations");
  const format = await getFormat();
  return (
    <div className="flex flex-col gap-6">
      <Link href="/admin/organisations" className="text-brand underline underline-offset-4">
        {t("back")}
      </Link>
      <h1 className="text-3xl font-bold">{org.name}</h1>
      <OrganisationForm
        organisationId={org.id}
        initial={{
          name: org.name,
          kind: org.kind,
          parentName: org.parentName ?? "",
          phone: org.phone ?? "",
          outOfHoursPhone: org.outOfHoursPhone ?? "",
          inboxEmail: org.inboxEmail ?? "",
          locale: org.locale as Locale,
          languages: org.languages as Locale[],
          requireTwoFactor: org.requireTwoFactor,
          twoFactorRelaxedReason: org.twoFactorRelaxedReason ?? "",
        }}
      />
      {!org.requireTwoFactor && org.twoFactorRelaxedAt ? (
        <Notice tone="warn" title={t("twoFactorRelaxedTitle")}>
          <p>
            {t("twoFactorRelaxedRecord", { name: org.twoFactorRelaxedByName ?? t("someone"), date: format.dateTime(org.twoFactorRelaxedAt, { dateStyle: "medium", timeStyle: "short" }) })}
          </p>
          <p className="italic">“{org.twoFactorRelaxedReason}”</p>
        </Notice>
      ) : null}
    </div>
  );
}
