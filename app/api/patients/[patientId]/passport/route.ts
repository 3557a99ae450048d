import { getCurrentPassport, getPassportOverview } from "@/db/queries/passports";
import { requireRole, requireStaffPatientAccess } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { handle, json } from "@/lib/http";
import { issuePassport } from "@/lib/passport";
import { openPatientRecord } from "@/lib/patient-record";
import { parseJsonBody } from "@/lib/validate";
import { passportIssueSchema } from "@/lib/validations/passport";

type Ctx = { params: Promise<{ patientId: string }> };

/** The current passport and every earlier one: who issued it, when, languages. Never a token. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  await openPatientRecord({ viewer, patientId, action: "patient.view.passport", request, details: { source: "api" } });
  return json(await getPassportOverview({ patientId }));
});

/**
 * Issue, or reissue with `{ "reissue": true }`: a new token and short code, the booklet made
 * and stored, the old passport revoked at once. The answer carries the token address, the
 * code and the QR once; nothing can show them again.
 */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  const via = await requireStaffPatientAccess(viewer, patientId);
  const input = await parseJsonBody(request, passportIssueSchema);
  const current = await getCurrentPassport({ patientId });
  if (current && input.reissue !== true) {
    throw new AppError("conflict", "This patient already has a passport. Confirm the reissue to revoke it.", {
      fields: { reissue: ["confirm_reissue"] },
    });
  }
  const issued = await issuePassport({ viewer, patientId, via: via === "visit_access" ? "visit_access" : "care_team", request });
  return json(
    {
      passport: issued.passport,
      url: issued.url,
      shortCode: issued.shortCode,
      qrSvg: issued.qrSvg,
      revokedIds: issued.revokedIds,
      pdfUrl: `/api/patients/${patientId}/passport/pdf`,
    },
    { status: 201 },
  );
});
