import { requirePortalPatient, requirePortalViewer } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle } from "@/lib/http/handle";
import { readerBooklet } from "@/lib/passport";
import { portalPatient } from "@/lib/portal";
import { audit } from "@/lib/records/audit";
import { dayIn } from "@/lib/shared/time-zone";

/**
 * The patient's booklet for the patient or a carer (?patient= picks among a carer's patients, as
 * on the portal pages), in the reader's text size and contrast. Reads only; audited.
 */
export const GET = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const requested = new URL(request.url).searchParams.get("patient") ?? undefined;
  const patient = await portalPatient(viewer, requested);
  // A patient asked for by id that is not one of theirs: 404, as for any record they cannot see.
  if (!patient || (requested !== undefined && patient.id !== requested)) throw new AppError("not_found");
  const via = await requirePortalPatient(viewer, patient.id);
  const pdf = await readerBooklet({ viewer, patientId: patient.id });
  await audit({ action: "passport.download", actor: viewer, patientId: patient.id, via, request, details: { readerCopy: true } });
  return new Response(new Uint8Array(pdf), {
    status: 200,
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="caddis-booklet-${dayIn(new Date())}.pdf"`,
      "Content-Length": String(pdf.byteLength),
      "X-Content-Type-Options": "nosniff",
      "Cache-Control": "no-store",
    },
  });
});
