import { listOrganisationsManagedBy } from "@/db/queries/organisations";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http";

export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  return json({ organisations: await listOrganisationsManagedBy({ organisationIds: viewer.organisationIds }) });
});
