import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { checkDraft } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { deviceCheckSchema } from "@/lib/validations/episode";

/** The device-check findings for a draft; writes nothing but the audit event of the look-up. */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, deviceCheckSchema);
  const findings = await checkDraft(ctx, input);
  return json({ findings, stopCodes: findings.filter((f) => f.severity === "stop").map((f) => f.code) });
});
