import { getFhirExportData } from "@/db/queries/fhir-export";
import { requireRole } from "@/lib/auth/permissions";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { buildFhirBundle } from "@/lib/fhir/export";
import { handle } from "@/lib/http";
import { openPatientRecord } from "@/lib/patient-record";

type Ctx = { params: Promise<{ patientId: string }> };

/** FHIR R4 Bundle of the record, for staff with access (care team or visit access); audited. */
export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireRole(request, "clinician");
  await openPatientRecord({ viewer, patientId, action: "patient.export.fhir", request });
  const data = await getFhirExportData({ patientId });
  if (!data) throw new AppError("not_found");
  const bundle = buildFhirBundle({ ...data, base: new URL(env.APP_URL).origin });
  return new Response(JSON.stringify(bundle), {
    status: 200,
    headers: {
      "content-type": "application/fhir+json; charset=utf-8",
      "content-disposition": `attachment; filename="caddis-${patientId}.fhir.json"`,
    },
  });
});
