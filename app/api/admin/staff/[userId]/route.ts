import { getStaffMember } from "@/db/queries/staff";
import { updateStaff } from "@/lib/admin/staff";
import { requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { updateStaffSchema } from "@/lib/validations/staff";

type Ctx = { params: Promise<{ userId: string }> };

/** A member of staff of one of the admin's organisations; anyone else answers 404. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { userId } = await params;
  const member = await getStaffMember({ userId, organisationIds: viewer.organisationIds });
  if (!member) throw new AppError("not_found");
  return json({ member });
});

/** Changes the role and/or the memberships among the admin's organisations. */
export const PATCH = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { userId } = await params;
  const input = await parseJsonBody(request, updateStaffSchema);
  await updateStaff({ viewer, userId, input, request });
  const member = await getStaffMember({ userId, organisationIds: viewer.organisationIds });
  return json({ member });
});
