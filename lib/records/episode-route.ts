import "server-only";
// The opening every episode route handler shares, in the order the access matrix expects:
// signed in (401) → a clinician (403) → on this patient's care team or visit access (404) →
// then the body (400). Nothing is read from the body before access is settled.
import type { z } from "zod";
import { requireRole, requireStaffPatientAccess } from "@/lib/auth/permissions";
import { parseJsonBody } from "@/lib/http/validate";

export type PatientRouteContext = { params: Promise<{ patientId: string }> };

export async function openEpisodeRequest<S extends z.ZodType>(request: Request, context: PatientRouteContext, schema: S) {
  const { patientId } = await context.params;
  const viewer = await requireRole(request, "clinician");
  await requireStaffPatientAccess(viewer, patientId);
  const input = await parseJsonBody(request, schema);
  return { ctx: { viewer, patientId, request }, input };
}
