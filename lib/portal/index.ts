import "server-only";
// Which patient a portal page is about: the patient themselves, or for a carer the patient chosen
// with ?patient= (only among their active links), else the first. Access is rechecked by every
// route handler; this only picks what to show.
import { inArray } from "drizzle-orm";
import { db } from "@/db";
import { patients } from "@/db/schema";
import type { Viewer } from "@/lib/auth/session";

export type PortalPatient = { id: string; givenName: string; familyName: string; weightKg: number | null; fluidLimitMl: number | null };

export async function portalPatients(viewer: Viewer): Promise<PortalPatient[]> {
  if (!viewer.patientIds.length) return [];
  return db
    .select({ id: patients.id, givenName: patients.givenName, familyName: patients.familyName, weightKg: patients.weightKg, fluidLimitMl: patients.fluidLimitMl })
    .from(patients)
    .where(inArray(patients.id, viewer.patientIds))
    .orderBy(patients.familyName, patients.givenName);
}

export async function portalPatient(viewer: Viewer, requested?: string | string[]): Promise<PortalPatient | null> {
  const list = await portalPatients(viewer);
  const want = Array.isArray(requested) ? requested[0] : requested;
  return list.find((p) => p.id === want) ?? list[0] ?? null;
}

/** For carers: the name shown as "You are answering for …". */
export function subjectName(viewer: Viewer, p: PortalPatient): string | null {
  return viewer.role === "carer" ? `${p.givenName} ${p.familyName}` : null;
}

