import { listCaseload } from "@/db/queries/caseload";
import { requireRole } from "@/lib/auth/permissions";
import { audit } from "@/lib/records/audit";
import { getCaseloadWindows } from "@/lib/config/settings";
import { handle, json } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { caseloadQuerySchema } from "@/lib/validations/caseload";

/** One page of the viewer's caseload: GET /api/caseload?page&pageSize&q&filter&sort&dir */
export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "clinician");
  const query = parseInput(caseloadQuerySchema, searchParamsObject(request.url));
  const { dueSoonDays, twocWindowHours } = await getCaseloadWindows();
  const result = await listCaseload({ organisationIds: viewer.organisationIds, query, dueSoonDays, twocWindowHours });
  await audit({
    action: "caseload.view",
    actor: viewer,
    via: "care_team",
    request,
    // The search text is not kept: it may be a name or a record number.
    details: { filter: query.filter ?? null, sort: query.sort, dir: query.dir, page: query.page, searched: Boolean(query.q), count: result.rows.length },
  });
  return json(result);
});
