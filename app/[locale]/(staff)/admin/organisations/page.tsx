import { getTranslations } from "next-intl/server";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { listOrganisationsManagedBy } from "@/db/queries/organisations";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

// A phone number keeps its digit groups in order inside right-to-left text.
const isolate = (s: string) => `\u2066${s}\u2069`;

export async function generateMetadata() {
  const t = await getTranslations("AdminOrganisations");
  return { title: t("title") };
}

export default async function OrganisationsPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const t = await getTranslations("AdminOrganisations");
  const a = await getTranslations("Admin");
  const orgs = await listOrganisationsManagedBy({ organisationIds: viewer.organisationIds });
  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-bold">{t("title")}</h1>
          <p className="text-ink-soft">{t("intro")}</p>
        </div>
        <Link href="/admin/organisations/new" className={buttonClass("primary")}>
          {t("new")}
        </Link>
      </div>
      <ul className="grid gap-3 md:grid-cols-2">
        {orgs.map((o) => (
          <li key={o.id}>
            <Card className="flex h-full flex-col gap-1">
              <p className="text-lg font-bold">
                <Link href={`/admin/organisations/${o.id}`} className="text-brand underline underline-offset-4">
                  {o.name}
                </Link>
              </p>
              <p className="text-ink-soft">
                {a(`kind.${o.kind}`)}
                {o.parentName ? ` · ${o.parentName}` : ""}
              </p>
              <p className="tabular">{a("staffCount", { count: o.staffCount })}</p>
              {o.phone ? <p className="tabular">{a("phone", { phone: isolate(o.phone) })}</p> : <p className="text-ink-soft">{t("noPhone")}</p>}
              {o.inboxEmail ? <p className="break-all text-sm">{t("inboxShort", { email: o.inboxEmail })}</p> : null}
            </Card>
          </li>
        ))}
      </ul>
      <p className="text-sm text-ink-soft">{t("directoryNote")}</p>
    </div>
  );
}
