import { findPatientAccess } from "@/db/queries/access";
import { grantVisitAccess } from "@/db/queries/passport-card";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { findPassport, isMistypedCode } from "@/lib/qr/device-card";
import { LIMITS, limitByAddress } from "@/lib/http/rate-limit";
import { parseJsonBody } from "@/lib/http/validate";
import { visitAccessSchema } from "@/lib/validations/visit-access";

export const VISIT_ACCESS_HOURS = 24;

// A clinician of any organisation, holding the passport's token or short code, states why they
// need the record: 24 hours of visit access (checked in lib/auth/permissions → db/queries/access,
// which ignores expired grants), audited with the reason. The care team needs no grant.
export const POST = handle(async (request) => {
  const viewer = await requireRole(request, "clinician");
  const body = await parseJsonBody(request, visitAccessSchema);
  // The short code is guessable in principle: the same per-address limit as the card.
  await limitByAddress(request, LIMITS.passportCard);
  const passport = await findPassport(body.token);
  if (!passport && isMistypedCode(body.token)) {
    throw new AppError("validation_failed", "The code has a typing mistake.", { fields: { token: ["check_code"] } });
  }
  if (!passport) throw new AppError("not_found");
  const current = await findPatientAccess({ userId: viewer.userId, role: viewer.role, patientId: passport.patientId });
  if (current === "care_team") return json({ patientId: passport.patientId, via: "care_team", expiresAt: null });
  const grant = await writeRecord(passport.patientId, async (tx) => {
    const g = await grantVisitAccess({ patientId: passport.patientId, userId: viewer.userId, reason: body.reason, hours: VISIT_ACCESS_HOURS }, tx);
    await audit(
      {
        action: "visit-access.grant",
        actor: viewer,
        patientId: passport.patientId,
        via: "visit_access",
        reason: body.reason,
        request,
        details: { expiresAt: g.expiresAt.toISOString(), passportId: passport.passportId },
      },
      tx,
    );
    return g;
  });
  return json({ patientId: passport.patientId, via: "visit_access", expiresAt: grant.expiresAt.toISOString() }, { status: 201 });
});
