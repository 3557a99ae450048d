import { reactivateStaff } from "@/lib/admin/staff";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

export const POST = handle<{ params: Promise<{ userId: string }> }>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { userId } = await params;
  return json(await reactivateStaff({ viewer, userId, request }));
});
