import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { handle, json } from "@/lib/http/handle";
import { visitSchema } from "@/lib/validations/visit";
import { recordVisit } from "@/lib/records/visits";

/** Record a visit, with NEWS2 observations when taken (care team or visit access). */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, visitSchema);
  const result = await recordVisit(ctx, input);
  return json(result, { status: 201 });
});
