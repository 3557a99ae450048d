import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { recordInsertion } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { insertionSchema } from "@/lib/validations/episode";

/** Record an insertion when no catheter is in place. */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, insertionSchema);
  const result = await recordInsertion(ctx, input);
  return json(result, { status: 201 });
});
