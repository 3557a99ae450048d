import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { planTwoc } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { twocPlanSchema } from "@/lib/validations/episode";

/** Plan (or clear) the trial without catheter of the catheter in place. */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, twocPlanSchema);
  return json(await planTwoc(ctx, input));
});
