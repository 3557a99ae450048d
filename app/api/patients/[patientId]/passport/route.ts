import { getCurrentPassport, getPassportOverview } from "@/db/queries/passports";
import { requireCareTeam, requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { issuePassport } from "@/lib/passport";
import { openPatientRecord } from "@/lib/records/patient-record";
import { parseJsonBody } from "@/lib/http/validate";
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
 * code and the QR once; nothing can show them again. `{ "activationCode": true }` also prints
 * a fresh portal activation code on a booklet sent in this answer (only the HMAC is kept).
 */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  // Only the care team: a clinician with visit access must not revoke the QR in the patient's booklet.
  await requireCareTeam(viewer, patientId);
  const input = await parseJsonBody(request, passportIssueSchema);
  const current = await getCurrentPassport({ patientId });
  if (current && input.reissue !== true) {
    throw new AppError("conflict", "This patient already has a passport. Confirm the reissue to revoke it.", {
      fields: { reissue: ["confirm_reissue"] },
    });
  }
  const issued = await issuePassport({
    viewer,
    patientId,
    via: "care_team",
    request,
    withActivationCode: input.activationCode === true,
  });
  return json(
    {
      passport: issued.passport,
      url: issued.url,
      shortCode: issued.shortCode,
      qrSvg: issued.qrSvg,
      revokedIds: issued.revokedIds,
      pdfUrl: `/api/patients/${patientId}/passport/pdf`,
      gpSummaryQueued: issued.gpSummaryQueued,
      // The booklet with the activation code travels in this answer only; it is never stored.
      activation: issued.activation
        ? {
            code: issued.activation.code,
            expiresAt: issued.activation.expiresAt,
            activateUrl: issued.activation.activateUrl,
            pdfBase64: issued.activation.pdf.toString("base64"),
          }
        : null,
    },
    { status: 201 },
  );
});
