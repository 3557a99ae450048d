import { db } from "@/db";
import { getManagedOrganisation, twoFactorPolicyValues, updateOrganisation } from "@/db/queries/organisations";
import { auditTwoFactorPolicy } from "@/lib/admin/organisations";
import { audit } from "@/lib/records/audit";
import { isUuid, requireRole } from "@/lib/auth/permissions";
import { AppError, pgConstraint } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { organisationPatchSchema } from "@/lib/validations/organisation";

type Ctx = { params: Promise<{ organisationId: string }> };

/** An organisation the admin belongs to; any other answers 404. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { organisationId } = await params;
  const organisation = isUuid(organisationId)
    ? await getManagedOrganisation({ id: organisationId, organisationIds: viewer.organisationIds })
    : null;
  if (!organisation) throw new AppError("not_found");
  return json({ organisation });
});

export const PATCH = handle<Ctx>(async (request, { params }) => {
  const viewer = await requireRole(request, "admin");
  const { organisationId } = await params;
  if (!isUuid(organisationId) || !viewer.organisationIds.includes(organisationId)) throw new AppError("not_found");
  const input = await parseJsonBody(request, organisationPatchSchema);
  try {
    const organisation = await db.transaction(async (tx) => {
      const before = await getManagedOrganisation({ id: organisationId, organisationIds: viewer.organisationIds }, tx);
      if (!before) throw new AppError("not_found");
      if (Object.keys(input).length === 0) return before;
      const { requireTwoFactor: _require, twoFactorRelaxedReason: _reason, ...rest } = input;
      const policy = twoFactorPolicyValues(input, { actorUserId: viewer.userId, before });
      const row = await updateOrganisation({ id: organisationId, values: { ...rest, ...policy } }, tx);
      const changed = Object.keys(input).filter(
        (k) => JSON.stringify(before[k as keyof typeof before]) !== JSON.stringify(row![k as keyof typeof row]),
      );
      await audit(
        { action: "admin.organisation.update", actor: viewer, organisationId, via: "admin", request, details: { changed } },
        tx,
      );
      if (Object.keys(policy).length) await auditTwoFactorPolicy({ viewer, organisationId, row: row!, request }, tx);
      return row;
    });
    return json({ organisation });
  } catch (error) {
    if (pgConstraint(error) === "organisations_name_kind_uq") {
      throw new AppError("conflict", "An organisation of this kind with this name exists already.", { fields: { name: ["name_taken"] } });
    }
    throw error;
  }
});
