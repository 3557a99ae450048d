import { insertOrganisation, listOrganisationsManagedBy, twoFactorPolicyValues } from "@/db/queries/organisations";
import { auditTwoFactorPolicy } from "@/lib/admin/organisations";
import { db } from "@/db";
import { audit } from "@/lib/records/audit";
import { requireRole } from "@/lib/auth/permissions";
import { AppError, pgConstraint } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { organisationSchema } from "@/lib/validations/organisation";

export const GET = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  return json({ organisations: await listOrganisationsManagedBy({ organisationIds: viewer.organisationIds }) });
});

/** A new ward, team or GP practice; the admin who creates it becomes its member. */
export const POST = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const input = await parseJsonBody(request, organisationSchema);
  try {
    const organisation = await db.transaction(async (tx) => {
      const { requireTwoFactor: _require, twoFactorRelaxedReason: _reason, ...rest } = input;
      const policy = twoFactorPolicyValues(input, { actorUserId: viewer.userId });
      const row = await insertOrganisation({ values: { ...rest, ...policy }, creatorUserId: viewer.userId }, tx);
      await audit(
        { action: "admin.organisation.create", actor: viewer, organisationId: row.id, via: "admin", request, details: { kind: row.kind } },
        tx,
      );
      if (!row.requireTwoFactor) await auditTwoFactorPolicy({ viewer, organisationId: row.id, row, request }, tx);
      return row;
    });
    return json({ organisation }, { status: 201 });
  } catch (error) {
    if (pgConstraint(error) === "organisations_name_kind_uq") {
      throw new AppError("conflict", "An organisation of this kind with this name exists already.", { fields: { name: ["name_taken"] } });
    }
    throw error;
  }
});
