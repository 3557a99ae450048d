import { listCaseload } from "@/db/queries/caseload";
import { requireRole } from "@/lib/auth/permissions";
import { audit } from "@/lib/audit";
import { handle, json } from "@/lib/http";

export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "clinician");
  const rows = await listCaseload({ organisationIds: viewer.organisationIds });
  await audit({ action: "caseload.view", actor: viewer, via: "care_team", request, details: { count: rows.length } });
  return json({ rows });
});
