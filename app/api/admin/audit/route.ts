import { searchAudit } from "@/db/queries/audit-search";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { auditQuerySchema } from "@/lib/validations/audit";

/**
 * Audit search for an admin: who opened or changed which record, when and how, limited to
 * patients of their organisations and to their organisations' staff. Filterable and paginated.
 */
export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const { page, pageSize, ...query } = parseInput(auditQuerySchema, searchParamsObject(request.url));
  const { rows, total } = await searchAudit({ organisationIds: viewer.organisationIds, query, limit: pageSize, offset: (page - 1) * pageSize });
  return json({ events: rows, page, pageSize, total, pages: Math.max(1, Math.ceil(total / pageSize)) });
});
