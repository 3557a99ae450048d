import { assertSecondFactor, requireUser } from "@/lib/auth/permissions";
import { endSession } from "@/lib/auth/sessions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";

type Ctx = { params: Promise<{ sessionId: string }> };

/** Ends one of the person's own sessions; anyone else's answers 404, like one that does not exist. */
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireUser(request);
  assertSecondFactor(viewer);
  const { sessionId } = await params;
  if (!/^[A-Za-z0-9_-]{8,128}$/.test(sessionId)) throw new AppError("not_found");
  return json(await endSession(viewer, sessionId, request));
});
