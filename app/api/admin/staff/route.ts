import { listPendingInvitations, listStaff } from "@/db/queries/staff";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

/** Staff of the admin's organisations, and the invitations still open. */
export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const [staff, invitations] = await Promise.all([
    listStaff({ organisationIds: viewer.organisationIds }),
    listPendingInvitations({ organisationIds: viewer.organisationIds }),
  ]);
  return json({ staff, invitations });
});
