import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { recordTwoc } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { twocSchema } from "@/lib/validations/episode";

/** Record the outcome of a trial without catheter. */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, twocSchema);
  const result = await recordTwoc(ctx, input);
  return json(result, { status: 201 });
});
