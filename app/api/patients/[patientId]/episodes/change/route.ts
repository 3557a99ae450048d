import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { recordChange } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { changeSchema } from "@/lib/validations/episode";

/** End the catheter in place and start the new one, in one transaction. */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, changeSchema);
  const result = await recordChange(ctx, input);
  return json(result, { status: 201 });
});
