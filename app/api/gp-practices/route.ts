import { listGpPracticeDirectory } from "@/db/queries/patients";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

/** The directory of GP practices, for choosing a patient's practice. */
export const GET = handle(async (request) => {
  await requireRole(request, "clinician", "admin");
  return json({ practices: await listGpPracticeDirectory() });
});
