import { openEpisodeRequest, type PatientRouteContext } from "@/lib/records/episode-route";
import { recordFollowUpReview } from "@/lib/records/episodes";
import { handle, json } from "@/lib/http/handle";
import { followUpReviewSchema } from "@/lib/validations/episode";

/** The follow-up review of a patient discharged from the catheter caseload after a passed trial. */
export const POST = handle<PatientRouteContext>(async (request, context) => {
  const { ctx, input } = await openEpisodeRequest(request, context, followUpReviewSchema);
  return json(await recordFollowUpReview(ctx, input), { status: 201 });
});
