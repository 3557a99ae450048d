import { db } from "@/db";
import { searchAudit } from "@/db/queries/audit-search";
import { audit } from "@/lib/records/audit";
import { requireRole } from "@/lib/auth/permissions";
import { toCsv } from "@/lib/http/csv";
import { handle } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { auditQuerySchema } from "@/lib/validations/audit";

const EXPORT_LIMIT = 10_000;

/** The same search as a CSV file (at most 10 000 rows, newest first); the export is itself audited. */
export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const { page: _page, pageSize: _size, ...query } = parseInput(auditQuerySchema, searchParamsObject(request.url));
  const { rows, total } = await searchAudit({ organisationIds: viewer.organisationIds, query, limit: EXPORT_LIMIT, offset: 0 });
  await audit({ action: "admin.audit.export", actor: viewer, via: "admin", request, details: { filters: query, rows: rows.length, total } }, db);
  // A byte-order mark so names in every script open correctly in a spreadsheet.
  const csv = `\uFEFF${toCsv([
    ["time_utc", "action", "via", "reason", "actor_name", "actor_email", "actor_role", "patient_name", "health_record_number", "organisation", "details"],
    ...rows.map((r) => [
      r.at.toISOString(),
      r.action,
      r.via,
      r.reason,
      r.actor?.name,
      r.actor?.email,
      r.actor?.role,
      r.patient?.name,
      r.patient?.healthRecordNumber,
      r.organisation?.name,
      JSON.stringify(r.details),
    ]),
  ])}`;
  const day = new Date().toISOString().slice(0, 10);
  return new Response(csv, {
    status: 200,
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="caddis-audit-${day}.csv"`,
      "X-Content-Type-Options": "nosniff",
      ...(total > rows.length ? { "X-Caddis-Truncated": String(total) } : {}),
    },
  });
});
