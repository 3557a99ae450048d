import { deactivateStaff } from "@/lib/admin/staff";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

/** Deactivates an account and ends every session it has, at once. */
export const POST = handle<{ params: Promise<{ userId: string }> }>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { userId } = await params;
  return json(await deactivateStaff({ viewer, userId, request }));
});
