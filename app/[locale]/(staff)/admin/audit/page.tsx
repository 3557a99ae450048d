import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { actionMessageKey } from "@/lib/shared/audit-actions";
import { auditVia } from "@/db/schema/security";
import { buttonClass } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { searchAudit } from "@/db/queries/audit-search";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { auditQuerySchema } from "@/lib/validations/audit";
import { TableHead } from "@/components/ui/table-head";

export async function generateMetadata() {
  const t = await getTranslations("AdminAudit");
  return { title: t("title") };
}

const vias = auditVia;
const inputClass = "min-h-12 rounded-lg border-2 border-stone-line bg-paper-raised px-3 text-ink";

export default async function AuditPage({
  params,
  searchParams,
}: {
  params: Promise<{ locale: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const t = await getTranslations("AdminAudit");
  const tl = await getTranslations("PatientAccessLog");
  const vocab = await getTranslations("Vocabulary");
  const format = await getFormat();
  // The action in words (the code stays beside it, small, for the action filter).
  const actionWords = (a: string) => {
    const key = actionMessageKey(a);
    if (tl.has(`actions.${key}` as "actions.patient_create")) return tl(`actions.${key}` as "actions.patient_create");
    if (t.has(`actions.${key}` as "actions.caseload_view")) return t(`actions.${key}` as "actions.caseload_view");
    return a;
  };
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]).filter(([, v]) => v !== undefined)) as Record<string, string>;
  const parsed = auditQuerySchema.safeParse(raw);
  const q = parsed.success ? parsed.data : auditQuerySchema.parse({});
  const { page, pageSize, ...filters } = q;
  const { rows, total } = await searchAudit({ organisationIds: viewer.organisationIds, query: filters, limit: pageSize, offset: (page - 1) * pageSize });
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const qs = (extra: Record<string, string | number>) => {
    const p = new URLSearchParams();
    for (const [k, v] of Object.entries({ ...filters, ...extra })) if (v !== undefined && v !== "") p.set(k, String(v));
    return p.toString();
  };
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      {!parsed.success ? <ErrorAlert message={t("badFilters")} testId="bad-filters" /> : null}
      <form method="get" className="grid gap-3 rounded-card border border-stone-faint bg-paper-raised p-4 md:grid-cols-3" role="search" aria-label={t("filters")}>
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("person")}</span>
          <input name="person" defaultValue={filters.person ?? ""} className={inputClass} placeholder={t("personPlaceholder")} />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("patient")}</span>
          <input name="patient" defaultValue={filters.patient ?? ""} className={inputClass} placeholder={t("patientPlaceholder")} />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("action")}</span>
          <input name="action" defaultValue={filters.action ?? ""} className={inputClass} placeholder="patient.view" list="audit-actions" dir="ltr" />
          <datalist id="audit-actions">
            {["patient.view", "patient.export", "patient.close", "episode", "admin.staff", "admin.organisation", "admin.settings", "account", "retention.remove"].map((a) => (
              <option key={a} value={a} />
            ))}
          </datalist>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("via")}</span>
          <select name="via" defaultValue={filters.via ?? ""} className={inputClass}>
            <option value="">{t("anyVia")}</option>
            {vias.map((v) => (
              <option key={v} value={v}>
                {vocab(`accessVia.${v}`)}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("from")}</span>
          <input type="date" name="from" defaultValue={filters.from ?? ""} className={inputClass} />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-bold">{t("to")}</span>
          <input type="date" name="to" defaultValue={filters.to ?? ""} className={inputClass} />
        </label>
        <div className="flex flex-wrap gap-3 md:col-span-3">
          <button type="submit" className={buttonClass("primary")}>
            {t("search")}
          </button>
          <Link href="/admin/audit" className={buttonClass("quiet")}>
            {t("clear")}
          </Link>
          <a href={`/api/admin/audit/export?${qs({})}`} className={buttonClass("secondary", "ms-auto")} download>
            {t("exportCsv")}
          </a>
        </div>
      </form>
      <p role="status" className="tabular">
        {t("found", { count: total })}
      </p>
      <div className="overflow-x-auto">
        <table className="w-full min-w-[48rem] border-collapse">
          <caption className="sr-only">{t("tableCaption")}</caption>
          <TableHead dense columns={[t("when"), t("who"), t("action"), t("patient"), t("via"), t("reason")]} />
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-stone-faint align-top">
                <td className="p-2 tabular whitespace-nowrap">
                  {format.dateTime(r.at, { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", second: "2-digit" })}
                </td>
                <td className="p-2">
                  {r.actor ? (
                    <>
                      <span className="font-bold">{r.actor.name}</span>
                      <div className="text-sm text-ink-soft">{r.actor.role ? vocab(`role.${r.actor.role as "admin"}`) : ""}</div>
                    </>
                  ) : (
                    <span className="text-ink-soft">{t("system")}</span>
                  )}
                </td>
                <td className="p-2">
                  {actionWords(r.action)}
                  <code className="block text-xs text-ink-soft" dir="ltr">
                    {r.action}
                  </code>
                </td>
                <td className="p-2">
                  {r.patient ? (
                    <>
                      {r.patient.name}
                      <div className="text-sm tabular text-ink-soft" dir="ltr">
                        {r.patient.healthRecordNumber}
                      </div>
                    </>
                  ) : r.organisation ? (
                    <span className="text-ink-soft">{r.organisation.name}</span>
                  ) : null}
                </td>
                <td className="p-2">{r.via ? vocab(`accessVia.${r.via as "qr"}`) : ""}</td>
                <td className="p-2 text-sm">{r.reason}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <nav aria-label={t("pagination")} className="flex items-center gap-3">
          {page > 1 ? (
            <Link href={`/admin/audit?${qs({ page: page - 1 })}`} className={buttonClass("secondary")}>
              {t("previous")}
            </Link>
          ) : null}
          <span className="tabular">{t("pageOf", { page, pages })}</span>
          {page < pages ? (
            <Link href={`/admin/audit?${qs({ page: page + 1 })}`} className={buttonClass("secondary")}>
              {t("next")}
            </Link>
          ) : null}
        </nav>
      ) : null}
    </div>
  );
}
