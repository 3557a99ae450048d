import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { CloseRecordForm } from "@/components/admin/close-record-form";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { listPatientsForAdmin } from "@/db/queries/admin-patients";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("AdminPatients");
  return { title: t("title") };
}

const inputClass = "min-h-12 rounded-lg border-2 border-stone-line bg-paper-raised px-3 text-ink";

export default async function AdminPatientsPage({
  params,
  searchParams,
}: {
  params: Promise<{ locale: string }>;
  searchParams: Promise<{ q?: string }>;
}) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const { q } = await searchParams;
  const query = typeof q === "string" ? q.trim().slice(0, 120) : "";
  const t = await getTranslations("AdminPatients");
  const format = await getFormat();
  const patients = await listPatientsForAdmin({ organisationIds: viewer.organisationIds, q: query || undefined });
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      <form method="get" role="search" aria-label={t("search")} className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("searchLabel")}</span>
          <input name="q" defaultValue={query} className={inputClass} />
        </label>
        <button type="submit" className={buttonClass("primary")}>
          {t("search")}
        </button>
      </form>
      {patients.length === 0 ? <p>{t("none")}</p> : null}
      <ul className="flex flex-col gap-3">
        {patients.map((p) => (
          <li key={p.id}>
            <Card className="flex flex-col gap-3">
              <div>
                <p className="text-lg font-bold">{p.name}</p>
                <p className="tabular text-ink-soft" dir="ltr">
                  {p.healthRecordNumber}
                </p>
                {p.closedAt ? (
                  <p className="font-bold">{t("closedOn", { when: format.dateTime(p.closedAt, { day: "numeric", month: "long", year: "numeric" }) })}</p>
                ) : null}
              </div>
              <div className="grid gap-4 md:grid-cols-2">
                <form method="get" action={`/api/patients/${p.id}/export`} className="flex flex-col gap-2">
                  <label className="flex flex-col gap-1">
                    <span className="font-bold">{t("exportReason")}</span>
                    <input name="reason" required minLength={3} maxLength={500} className={inputClass} placeholder={t("exportReasonPlaceholder")} />
                  </label>
                  <div className="flex flex-wrap gap-2">
                    <button type="submit" name="format" value="json" className={buttonClass("secondary")} aria-label={t("exportFor", { name: p.name })}>
                      {t("export")}
                    </button>
                    <button type="submit" name="format" value="fhir" className={buttonClass("secondary")} aria-label={t("exportFhirFor", { name: p.name })}>
                      {t("exportFhir")}
                    </button>
                  </div>
                </form>
                {p.closedAt ? null : <CloseRecordForm patientId={p.id} name={p.name} />}
              </div>
            </Card>
          </li>
        ))}
      </ul>
      <p className="text-sm text-ink-soft">{t("fhirNote")}</p>
    </div>
  );
}
