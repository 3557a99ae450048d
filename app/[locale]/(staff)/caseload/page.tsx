import { getFormatter, getTranslations } from "next-intl/server";
import { listCaseload } from "@/db/queries/caseload";
import { requirePageRole } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("Caseload");
  return { title: t("title") };
}

export default async function CaseloadPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "clinician");
  const t = await getTranslations("Caseload");
  const format = await getFormatter();
  const rows = await listCaseload({ organisationIds: viewer.organisationIds });
  const date = (d: string | null) => (d ? format.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "medium" }) : "—");
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro", { count: rows.length })}</p>
      </div>
      {rows.length === 0 ? (
        <p>{t("empty")}</p>
      ) : (
        <div className="overflow-x-auto rounded-card border border-stone-faint bg-paper-raised">
          <table className="w-full text-start">
            <thead className="bg-paper-sunk text-start">
              <tr>
                <th scope="col" className="p-3 text-start">{t("patient")}</th>
                <th scope="col" className="p-3 text-start">{t("device")}</th>
                <th scope="col" className="p-3 text-start">{t("nextChange")}</th>
                <th scope="col" className="p-3 text-start">{t("review")}</th>
                <th scope="col" className="p-3 text-start">{t("checkIn")}</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.patientId} className="border-t border-stone-faint">
                  <td className="p-3 font-bold">{r.name}</td>
                  <td className="tabular p-3">
                    {r.route ? t("deviceSummary", { route: r.route, size: r.sizeCh ?? 0 }) : t("noDevice")}
                  </td>
                  <td className="tabular p-3">{date(r.plannedChangeOn)}</td>
                  <td className="tabular p-3">{date(r.reviewDueOn)}</td>
                  <td className="p-3">{r.latestCheckInLevel ? t(`level.${r.latestCheckInLevel as "soon"}`) : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
