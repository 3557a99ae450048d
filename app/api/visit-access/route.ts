import { db } from "@/db";
import { findCurrentPassportByToken, grantVisitAccess } from "@/db/queries/passport-card";
import { audit } from "@/lib/audit";
import { requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { handle, json } from "@/lib/http";
import { parseJsonBody } from "@/lib/validate";
import { visitAccessSchema } from "@/lib/validations/visit-access";

const VISIT_ACCESS_HOURS = 24;

// A clinician of any organisation, holding the passport's token, states why they need the record.
export const POST = handle(async (request) => {
  const viewer = await requireRole(request, "clinician");
  const body = await parseJsonBody(request, visitAccessSchema);
  const passport = await findCurrentPassportByToken({ token: body.token });
  if (!passport) throw new AppError("not_found");
  const grant = await db.transaction(async (tx) => {
    const g = await grantVisitAccess({ patientId: passport.patientId, userId: viewer.userId, reason: body.reason, hours: VISIT_ACCESS_HOURS }, tx);
    await audit(
      { action: "visit-access.grant", actor: viewer, patientId: passport.patientId, via: "visit_access", reason: body.reason, request, details: { expiresAt: g.expiresAt.toISOString() } },
      tx,
    );
    return g;
  });
  return json({ patientId: passport.patientId, expiresAt: grant.expiresAt.toISOString() }, { status: 201 });
});
