import { inviteStaff } from "@/lib/admin/staff";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { inviteStaffSchema } from "@/lib/validations/staff";

/** Invites a new member of staff: a link valid for 72 hours, to one or more of the admin's organisations. */
export const POST = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const input = await parseJsonBody(request, inviteStaffSchema);
  return json(await inviteStaff({ viewer, input, request }), { status: 201 });
});
