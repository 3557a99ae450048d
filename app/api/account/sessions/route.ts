import { assertSecondFactor, requireUser } from "@/lib/auth/permissions";
import { endOtherSessions, listSessionsFor } from "@/lib/auth/sessions";
import { handle, json } from "@/lib/http/handle";

/** The signed-in person's own sessions: device, last used, approximate address; never a token. */
export const GET = handle(async (request) => {
  const viewer = await requireUser(request);
  assertSecondFactor(viewer);
  return json({ sessions: await listSessionsFor(viewer) });
});

/** Signs out every other device of theirs. */
export const DELETE = handle(async (request) => {
  const viewer = await requireUser(request);
  assertSecondFactor(viewer);
  return json(await endOtherSessions(viewer, request));
});
