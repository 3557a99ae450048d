import { isUuid, requireCarerManager, requireUser } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle } from "@/lib/http/handle";
import { removeCarer } from "@/lib/portal/invitations";

// Removing a carer takes effect at once: access is checked against the active link on every request.
export const DELETE = handle<{ params: Promise<{ patientId: string; linkId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  const { patientId, linkId } = await params;
  const via = await requireCarerManager(viewer, patientId);
  if (!isUuid(linkId)) throw new AppError("validation_failed", undefined, { fields: { linkId: ["invalid"] } });
  await removeCarer({ viewer, via, patientId, linkId, request });
  return new Response(null, { status: 204 });
});
