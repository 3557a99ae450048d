import "server-only";
// For the pages of a patient's record: the clinician role, then the access check and the audit
// event (openPatientRecord) BEFORE any data is loaded. A patient the viewer cannot reach shows
// the not-found page, the same as one that does not exist.
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import { cache } from "react";
import { requirePageRole, requireStaffPatientAccess } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { getRecordClosedAt } from "@/db/queries/patients";
import { openPatientRecord } from "@/lib/records/patient-record";

/** When the record was closed (null while open), once per request: a closed record's pages offer no writes. */
export const recordClosedAt = cache((patientId: string) => getRecordClosedAt({ patientId }));

function notFoundOn(error: unknown): never {
  if (error instanceof AppError && error.code === "not_found") notFound();
  throw error;
}

export async function openRecordPage({ locale, patientId, action }: { locale: string; patientId: string; action: string }) {
  const viewer = await requirePageRole(locale, "clinician");
  try {
    const via = await openPatientRecord({ viewer, patientId, action, request: { headers: await headers() } });
    return { viewer, via, closed: (await recordClosedAt(patientId)) !== null };
  } catch (error) {
    notFoundOn(error);
  }
}

/** The layout's check (no audit event of its own: each page writes one). Cached per request. */
export const checkRecordAccess = cache(async (locale: string, patientId: string) => {
  const viewer = await requirePageRole(locale, "clinician");
  try {
    return { viewer, via: await requireStaffPatientAccess(viewer, patientId) };
  } catch (error) {
    notFoundOn(error);
  }
});
