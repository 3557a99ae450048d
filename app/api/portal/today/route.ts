import { getTodaySummary } from "@/db/queries/portal";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "patient", "carer");
  const summaries = await Promise.all(viewer.patientIds.map((patientId) => getTodaySummary({ patientId })));
  return json({ patients: summaries.filter(Boolean) });
});
