import { getTranslations } from "next-intl/server";
import { Card } from "@/components/ui/card";
import { listOrganisationsManagedBy } from "@/db/queries/organisations";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("Admin");
  return { title: t("title") };
}

export default async function AdminPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const t = await getTranslations("Admin");
  const orgs = await listOrganisationsManagedBy({ organisationIds: viewer.organisationIds });
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      <section aria-labelledby="orgs" className="flex flex-col gap-3">
        <h2 id="orgs" className="text-xl font-bold">{t("organisations")}</h2>
        <ul className="grid gap-3 md:grid-cols-2">
          {orgs.map((o) => (
            <li key={o.id}>
              <Card>
                <p className="text-lg font-bold">{o.name}</p>
                <p className="text-ink-soft">
                  {t(`kind.${o.kind}`)}
                  {o.parentName ? ` · ${o.parentName}` : ""}
                </p>
                <p className="tabular mt-2">{t("staffCount", { count: o.staffCount })}</p>
                {o.phone ? <p className="tabular">{t("phone", { phone: o.phone })}</p> : null}
              </Card>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
