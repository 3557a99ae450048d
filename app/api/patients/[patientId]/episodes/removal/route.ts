import { openEpisodeRequest, type PatientRouteContext } from "@/lib/episode-route";
import { recordRemoval } from "@/lib/episodes";
import { handle, json } from "@/lib/http";
import { removalSchema } from "@/lib/validations/episode";

/** Record the removal of the catheter in place (optionally starting a trial without catheter). */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, removalSchema);
  const result = await recordRemoval(ctx, input);
  return json(result, { status: 201 });
});
