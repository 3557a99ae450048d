import { exportPatientData } from "@/db/queries/patient-export";
import { audit } from "@/lib/records/audit";
import { assertRole, isUuid, requireAdminOfPatient, requirePatientAccess, requireUser } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { patientFhirBundle } from "@/lib/fhir/bundle";
import { handle, json } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { exportRequestSchema } from "@/lib/validations/admin-patient";

/**
 * Everything Caddis holds about one patient: as JSON (every table's rows for them, secrets left
 * out) or, with `?format=fhir`, the clinical record as a FHIR R4 Bundle. For the patient
 * themselves, or for an admin of one of the patient's organisations on the patient's request.
 */
export const GET = handle<{ params: Promise<{ patientId: string }> }>(async (request, { params }) => {
  const viewer = await requireUser(request);
  assertRole(viewer, "patient", "admin");
  const { patientId } = await params;
  if (!isUuid(patientId)) throw new AppError("not_found");
  let via: "self" | "admin";
  if (viewer.role === "admin") {
    await requireAdminOfPatient(viewer, patientId);
    via = "admin";
  } else {
    if ((await requirePatientAccess(viewer, patientId)) !== "self") throw new AppError("not_found");
    via = "self";
  }
  const { reason, format } = parseInput(exportRequestSchema, searchParamsObject(request.url));
  const day = new Date().toISOString().slice(0, 10);
  if (format === "fhir") {
    const bundle = await patientFhirBundle({ patientId });
    await audit({ action: "patient.export", actor: viewer, patientId, via, request, reason: reason ?? null, details: { format: "fhir-r4" } });
    return new Response(JSON.stringify(bundle), {
      status: 200,
      headers: {
        "content-type": "application/fhir+json; charset=utf-8",
        "content-disposition": `attachment; filename="caddis-patient-record-${day}.fhir.json"`,
        "cache-control": "no-store",
      },
    });
  }
  const data = await exportPatientData({ patientId });
  if (!data) throw new AppError("not_found");
  await audit({ action: "patient.export", actor: viewer, patientId, via, request, reason: reason ?? null, details: { format: data.format } });
  return json(data, {
    headers: { "Content-Disposition": `attachment; filename="caddis-patient-data-${data.exportedAt.slice(0, 10)}.json"`, "Cache-Control": "no-store" },
  });
});
