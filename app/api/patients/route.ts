import { db } from "@/db";
import { createPatient } from "@/db/queries/patients";
import { requireRole } from "@/lib/auth/permissions";
import { audit } from "@/lib/records/audit";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { patientSchema } from "@/lib/validations/patient";

/** Registers a patient with one or more of the clinician's own organisations as care team. */
export const POST = handle(async (request) => {
  const viewer = await requireRole(request, "clinician");
  const input = await parseJsonBody(request, patientSchema);
  const created = await db.transaction(async (tx) => {
    const { id } = await createPatient({ input, allowedOrganisationIds: viewer.organisationIds }, tx);
    await audit(
      {
        action: "patient.create",
        actor: viewer,
        patientId: id,
        via: "care_team",
        request,
        details: { careTeam: [...new Set(input.careTeamOrganisationIds)] },
      },
      tx,
    );
    return { id };
  });
  return json({ patient: created }, { status: 201, headers: { Location: `/api/patients/${created.id}` } });
});
