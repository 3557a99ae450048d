import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { recordRemoval } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { removalSchema } from "@/lib/validations/episode";

/** Record the removal of the catheter in place (optionally starting a trial without catheter). */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, removalSchema);
  const result = await recordRemoval(ctx, input);
  return json(result, { status: 201 });
});
