import { listCaseloadAll } from "@/db/queries/caseload";
import { requireRole } from "@/lib/auth/permissions";
import { audit } from "@/lib/records/audit";
import { getCaseloadWindows } from "@/lib/config/settings";
import { toCsv } from "@/lib/http/csv";
import { handle } from "@/lib/http/handle";
import { translatorFor } from "@/lib/i18n/catalogues";
import { isLocale } from "@/lib/i18n/routing";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { caseloadViewSchema } from "@/lib/validations/caseload";

/** The filtered caseload (no paging) as CSV: GET /api/caseload/export?q&filter&sort&dir&locale */
export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "clinician");
  const params = searchParamsObject(request.url);
  const view = parseInput(caseloadViewSchema, params);
  const locale = params.locale && isLocale(params.locale) ? params.locale : viewer.locale && isLocale(viewer.locale) ? viewer.locale : "en";
  const t = translatorFor(locale, "CaseloadExport");
  const v = translatorFor(locale, "Vocabulary");
  const { dueSoonDays, twocWindowHours } = await getCaseloadWindows();
  const { rows, today } = await listCaseloadAll({ organisationIds: viewer.organisationIds, view, dueSoonDays, twocWindowHours });
  const csv = toCsv([
    [
      t("name"),
      t("hrn"),
      t("route"),
      t("sizeCh"),
      t("insertedOn"),
      t("daysSinceInsertion"),
      t("nextChange"),
      t("reviewDue"),
      t("state"),
      t("latestCheckIn"),
      t("awaitingTwoc"),
    ],
    ...rows.map((r) => [
      r.name,
      r.healthRecordNumber,
      r.route ? v(`route.${r.route}`) : "",
      r.sizeCh,
      r.insertedOn,
      r.daysSinceInsertion,
      r.plannedChangeOn,
      r.reviewDueOn,
      r.state ? t(`states.${r.state}`, { days: dueSoonDays }) : "",
      r.latestCheckInLevel ? v(`triageLevel.${r.latestCheckInLevel}`) : "",
      r.awaitingTwoc ? t("yes") : "",
    ]),
  ]);
  await audit({
    action: "caseload.export",
    actor: viewer,
    via: "care_team",
    request,
    details: { filter: view.filter ?? null, sort: view.sort, dir: view.dir, searched: Boolean(view.q), count: rows.length },
  });
  // A byte-order mark so spreadsheet programs read the names as UTF-8.
  return new Response(`\uFEFF${csv}`, {
    status: 200,
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="caseload-${today}.csv"`,
      "Cache-Control": "no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
