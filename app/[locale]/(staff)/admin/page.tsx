import { getTranslations } from "next-intl/server";
import { Card } from "@/components/ui/card";
import { ErrorAlert } from "@/components/ui/notice";
import { listOrganisationsManagedBy } from "@/db/queries/organisations";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

// A phone number keeps its digit groups in order inside right-to-left text.
const isolate = (s: string) => `\u2066${s}\u2069`;
import { getSettings } from "@/lib/config/settings";

export async function generateMetadata() {
  const t = await getTranslations("Admin");
  return { title: t("title") };
}

const sections = [
  { href: "/admin/organisations", key: "organisations" },
  { href: "/admin/staff", key: "staff" },
  { href: "/admin/settings", key: "settings" },
  { href: "/admin/audit", key: "audit" },
  { href: "/admin/patients", key: "patients" },
  { href: "/admin/sign-ins", key: "signIns" },
] as const;

export default async function AdminPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const t = await getTranslations("Admin");
  const h = await getTranslations("AdminHome");
  const nav = await getTranslations("AdminNav");
  const [orgs, settings] = await Promise.all([listOrganisationsManagedBy({ organisationIds: viewer.organisationIds }), getSettings()]);
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      {!settings.emergencyNumber ? (
        <ErrorAlert message={h("emergencyUnsetTitle")} testId="emergency-unset">
          <p>
            {h("emergencyUnset")}{" "}
            <Link href="/admin/settings" className="font-bold underline underline-offset-4">
              {h("goToSettings")}
            </Link>
          </p>
        </ErrorAlert>
      ) : null}
      <nav aria-label={h("sections")}>
        <ul className="grid gap-3 md:grid-cols-2 lg:grid-cols-3">
          {sections.map((s) => (
            <li key={s.href}>
              <Link href={s.href} className="block h-full rounded-card border border-stone-faint bg-paper-raised p-5 shadow-sm hover:border-brand">
                <span className="text-lg font-bold text-brand underline underline-offset-4">{nav(s.key)}</span>
                <span className="mt-1 block text-ink-soft">{h(`${s.key}Blurb`)}</span>
              </Link>
            </li>
          ))}
        </ul>
      </nav>
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
                {o.phone ? <p className="tabular">{t("phone", { phone: isolate(o.phone) })}</p> : null}
              </Card>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
