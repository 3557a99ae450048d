import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { auditVia } from "@/db/schema/security";
import { listAccessLog } from "@/db/queries/audit-log";
import { Link } from "@/lib/i18n/navigation";
import { openRecordPage } from "@/lib/records/patient-record-page";
import { accessLogQuerySchema } from "@/lib/validations/audit";
import { actionMessageKey } from "@/lib/shared/audit-actions";
import { isCareTeam } from "@/lib/auth/permissions";
import { TableHead } from "@/components/ui/table-head";

export async function generateMetadata() {
  const t = await getTranslations("PatientRecord.tabs");
  return { title: t("access") };
}

const PAGE_SIZE = 25;
const knownVia = auditVia;
const knownRoles = ["admin", "clinician", "patient", "carer"] as const;

export default async function AccessTab({
  params,
  searchParams,
}: {
  params: Promise<{ locale: string; patientId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { locale, patientId } = await params;
  const sp = await searchParams;
  const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  const parsed = accessLogQuerySchema.safeParse({ page: first(sp.page), pageSize: PAGE_SIZE, who: first(sp.who) });
  const page = parsed.success ? parsed.data.page : 1;
  const who = parsed.success ? parsed.data.who : "all";
  const { via } = await openRecordPage({ locale, patientId, action: "patient.view.access-log" });
  // The log is for the care team; a visiting clinician's attempt is itself logged above.
  if (!isCareTeam(via)) forbidden();
  const log = await listAccessLog({ patientId, page, pageSize: PAGE_SIZE, filter: who });
  const t = await getTranslations("PatientAccessLog");
  const v = await getTranslations("Vocabulary");
  const format = await getFormat();
  const pages = Math.max(1, Math.ceil(log.total / PAGE_SIZE));
  // Action codes use dots, which next-intl reads as nesting: look them up with underscores.
  const action = (a: string) => {
    const key = `actions.${actionMessageKey(a)}`;
    return t.has(key as "actions.patient_create") ? t(key as "actions.patient_create") : a;
  };
  const href = (p: number, w = who) => {
    const q = new URLSearchParams();
    if (w !== "all") q.set("who", w);
    if (p > 1) q.set("page", String(p));
    return `/patients/${patientId}/access${q.size ? `?${q}` : ""}`;
  };
  const time = (d: string) => format.dateTime(new Date(d), { timeStyle: "short" });

  return (
    <div className="flex flex-col gap-4">
      <div>
        <h2 className="text-2xl font-bold">{t("title")}</h2>
        <p className="text-ink-soft">{t("intro", { count: log.total })}</p>
      </div>
      <nav aria-label={t("filterLabel")} className="flex flex-wrap gap-2" data-testid="access-filter">
        {(["all", "outside"] as const).map((w) => (
          <Link
            key={w}
            href={href(1, w)}
            aria-current={who === w ? "page" : undefined}
            className={`inline-flex min-h-11 items-center rounded-lg border-2 px-4 font-bold ${who === w ? "border-brand bg-brand text-white" : "border-brand text-brand"}`}
          >
            {t(`filter.${w}`)}
          </Link>
        ))}
      </nav>
      <div className="overflow-x-auto rounded-card border border-stone-faint bg-paper-raised">
        <table className="w-full" data-testid="access-log">
          <caption className="sr-only">{t("title")}</caption>
          <TableHead columns={[t("when"), t("who"), t("what"), t("via"), t("reason")]} />
          <tbody>
            {log.entries.map((e) => (
              <tr key={e.id} className="border-t border-stone-faint align-top">
                <td className="tabular whitespace-nowrap p-3">{format.dateTime(new Date(e.at), { dateStyle: "medium", timeStyle: "medium" })}</td>
                <td className="p-3">
                  <span className="font-bold">{e.actorName ?? (e.actorRole ? t("unknownPerson") : t("notSignedIn"))}</span>
                  {e.actorRole ? (
                    <span className="block text-sm text-ink-soft">
                      {(knownRoles as readonly string[]).includes(e.actorRole) ? v(`role.${e.actorRole as "admin"}`) : e.actorRole}
                    </span>
                  ) : null}
                </td>
                <td className="p-3">
                  {action(e.action)}
                  {e.count > 1 ? (
                    <span className="block text-sm text-ink-soft" data-testid="access-grouped">
                      {t("grouped", { count: e.count, from: time(e.firstAt), to: time(e.at) })}
                    </span>
                  ) : null}
                </td>
                <td className="p-3">{e.via && (knownVia as readonly string[]).includes(e.via) ? v(`accessVia.${e.via}`) : "—"}</td>
                <td className="p-3">{e.reason ?? "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <nav aria-label={t("pagesLabel")} className="flex flex-wrap items-center gap-3">
        {page > 1 ? (
          <Link href={href(page - 1)} className="inline-flex min-h-11 items-center rounded-lg border-2 border-brand px-4 font-bold text-brand">
            {t("newer")}
          </Link>
        ) : null}
        <span className="tabular">{t("pageOf", { page, pages })}</span>
        {page < pages ? (
          <Link href={href(page + 1)} className="inline-flex min-h-11 items-center rounded-lg border-2 border-brand px-4 font-bold text-brand">
            {t("older")}
          </Link>
        ) : null}
      </nav>
    </div>
  );
}
