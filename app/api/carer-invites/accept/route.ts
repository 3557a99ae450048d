import { getViewerFromHeaders } from "@/lib/auth/session";
import { handle, json } from "@/lib/http/handle";
import { acceptCarerInvite, withCookies } from "@/lib/portal/invitations";
import { parseJsonBody } from "@/lib/http/validate";
import { acceptCarerInviteSchema } from "@/lib/validations/invitations";

// A carer accepts an invitation: signed in already, with the password of their carer account,
// or by making a new carer account for the invited address. Limited per address.
export const POST = handle(async (request) => {
  const input = await parseJsonBody(request, acceptCarerInviteSchema);
  const viewer = await getViewerFromHeaders(request.headers);
  const { cookies } = await acceptCarerInvite({ ...input, viewer, request });
  return withCookies(json({ next: "today" }, { status: 200 }), cookies);
});
