import { requireRole } from "@/lib/auth/permissions";
import { patientFhirBundle } from "@/lib/fhir/bundle";
import { handle } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";

type Ctx = { params: Promise<{ patientId: string }> };

/** FHIR R4 Bundle of the record, for staff with access (care team or visit access); audited. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  await openPatientRecord({ viewer, patientId, action: "patient.export.fhir", request });
  const bundle = await patientFhirBundle({ patientId });
  return new Response(JSON.stringify(bundle), {
    status: 200,
    headers: {
      "content-type": "application/fhir+json; charset=utf-8",
      "content-disposition": `attachment; filename="caddis-${patientId}.fhir.json"`,
    },
  });
});
