import { openEpisodeRequest, type PatientRouteContext } from "@/lib/episode-route";
import { handle, json } from "@/lib/http";
import { visitSchema } from "@/lib/validations/visit";
import { recordVisit } from "@/lib/visits";

/** Record a visit, with NEWS2 observations when taken (care team or visit access). */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, visitSchema);
  const result = await recordVisit(ctx, input);
  return json(result, { status: 201 });
});
