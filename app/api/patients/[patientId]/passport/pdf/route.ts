import { getCurrentPassport } from "@/db/queries/passports";
import { audit } from "@/lib/records/audit";
import { requireRole, requireStaffPatientAccess } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle } from "@/lib/http/handle";
import { passportPdfKey } from "@/lib/passport";
import { getObjectStream } from "@/lib/storage";
import { dayIn } from "@/lib/shared/time-zone";

type Ctx = { params: Promise<{ patientId: string }> };

/** The booklet of the current passport, exactly as it was made at issue time. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  const via = await requireStaffPatientAccess(viewer, patientId);
  const current = await getCurrentPassport({ patientId });
  await audit({ action: "passport.download", actor: viewer, patientId, via, request, details: { passportId: current?.id ?? null } });
  if (!current) throw new AppError("not_found", "No passport has been issued for this patient.");
  const object = await getObjectStream({ key: passportPdfKey({ patientId, passportId: current.id }) });
  if (!object) throw new AppError("not_found", "The booklet of this passport is missing. Reissue the passport.");
  const headers = new Headers({
    "Content-Type": "application/pdf",
    "Content-Disposition": `attachment; filename="caddis-passport-${dayIn(new Date(current.issuedAt))}.pdf"`,
    "X-Content-Type-Options": "nosniff",
    "Cache-Control": "no-store",
  });
  if (object.size !== undefined) headers.set("Content-Length", String(object.size));
  return new Response(object.body, { status: 200, headers });
});
