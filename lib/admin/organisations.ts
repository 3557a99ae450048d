import "server-only";
// An organisation's two-step sign-in policy is an audit event of its own, with the reason in the
// event's reason field, so relaxing it is never a silent side effect of an edit.
import type { Executor } from "@/db";
import type { OrganisationDetail } from "@/db/queries/organisations";
import type { Viewer } from "@/lib/auth/session";
import { audit } from "@/lib/records/audit";

export async function auditTwoFactorPolicy(
  { viewer, organisationId, row, request }: { viewer: Viewer; organisationId: string; row: Pick<OrganisationDetail, "requireTwoFactor" | "twoFactorRelaxedReason">; request: Request },
  tx: Executor,
) {
  await audit(
    {
      action: row.requireTwoFactor ? "admin.organisation.two_factor_required" : "admin.organisation.two_factor_relaxed",
      actor: viewer,
      organisationId,
      via: "admin",
      reason: row.requireTwoFactor ? null : row.twoFactorRelaxedReason,
      request,
    },
    tx,
  );
}
