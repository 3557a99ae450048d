import { endStaffSessions } from "@/lib/admin/staff";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

/** Signs a member of staff out on every device (a lost phone, a shared computer left signed in). */
export const POST = handle<{ params: Promise<{ userId: string }> }>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { userId } = await params;
  return json(await endStaffSessions({ viewer, userId, request }));
});
