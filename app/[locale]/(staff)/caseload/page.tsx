import { headers } from "next/headers";
import { getTranslations } from "next-intl/server";
import { CaseloadView } from "@/components/caseload/caseload-view";
import { CaseloadItemsPanel } from "@/components/caseload-items/caseload-items-panel";
import { openItemsFor } from "@/lib/records/caseload-items";
import { CaseloadReferrals } from "@/components/transfer/caseload-referrals";
import { listCaseload } from "@/db/queries/caseload";
import { getCaseloadWindows } from "@/lib/config/settings";
import { audit } from "@/lib/records/audit";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { caseloadQuerySchema } from "@/lib/validations/caseload";

export async function generateMetadata() {
  const t = await getTranslations("Caseload");
  return { title: t("title") };
}

export default async function CaseloadPage({
  params,
  searchParams,
}: {
  params: Promise<{ locale: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "clinician");
  const t = await getTranslations("Caseload");
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  // A hand-edited address with a bad value falls back to the default view rather than an error.
  const parsed = caseloadQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : caseloadQuerySchema.parse({});
  const { dueSoonDays, twocWindowHours } = await getCaseloadWindows();
  const [data, items] = await Promise.all([listCaseload({ organisationIds: viewer.organisationIds, query, dueSoonDays, twocWindowHours }), openItemsFor(viewer)]);
  await audit({
    action: "caseload.view",
    actor: viewer,
    via: "care_team",
    request: { headers: await headers() },
    details: { filter: query.filter ?? null, sort: query.sort, dir: query.dir, page: query.page, searched: Boolean(query.q), count: data.rows.length, source: "page" },
  });
  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-3xl font-bold">{t("title")}</h1>
          <p className="text-ink-soft">{t("intro")}</p>
        </div>
        <Link href="/patients/new" className="inline-flex min-h-12 items-center rounded-lg bg-brand px-5 font-bold text-white hover:bg-brand-strong">
          {t("register")}
        </Link>
      </div>
      <CaseloadItemsPanel items={items} />
      <CaseloadReferrals organisationIds={viewer.organisationIds} />
      <CaseloadView initialQuery={query} initialData={data} />
    </div>
  );
}
