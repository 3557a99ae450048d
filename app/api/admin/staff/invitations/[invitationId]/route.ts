import { withdrawInvitation } from "@/lib/admin/staff";
import { isUuid, requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";

/** Withdraws an open invitation; its link stops working at once. */
export const DELETE = handle<{ params: Promise<{ invitationId: string }> }>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { invitationId } = await params;
  if (!isUuid(invitationId)) throw new AppError("not_found");
  await withdrawInvitation({ viewer, invitationId, request });
  return json({ ok: true });
});
