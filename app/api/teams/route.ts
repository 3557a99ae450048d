import { searchTeamDirectory } from "@/db/queries/referrals";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { directoryQuerySchema } from "@/lib/validations/referrals";

/** The directory of the deployment's wards and community teams, for a referral (clinicians). */
export const GET = handle(async (request) => {
  await requireRole(request, "clinician");
  const { q } = parseInput(directoryQuerySchema, searchParamsObject(request.url));
  return json({ teams: await searchTeamDirectory({ q }) });
});
