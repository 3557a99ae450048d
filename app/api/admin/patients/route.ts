import { listPatientsForAdmin } from "@/db/queries/admin-patients";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { z } from "zod";

const querySchema = z.object({ q: z.string().trim().max(120).optional() });

/** Patients of the admin's organisations, by name or HRN: for data requests and closing records. */
export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const { q } = parseInput(querySchema, searchParamsObject(request.url));
  return json({ patients: await listPatientsForAdmin({ organisationIds: viewer.organisationIds, q: q || undefined }) });
});
