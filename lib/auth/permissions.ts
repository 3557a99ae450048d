import "server-only";
// The one module of authorisation checks. Every route handler, page and server action calls
// these on the server; hiding a link in the menu is never the control.
import { forbidden, redirect } from "next/navigation";
import { findPatientAccess, isAdminOfPatient, type PatientAccessVia } from "@/db/queries/access";
import { AppError } from "@/lib/http/errors";
import { getViewer, getViewerFromHeaders, needsSecondFactorSetup, type Role, type Viewer } from "./session";

/** Route handlers: the viewer, or 401. */
export async function requireUser(request: Request): Promise<Viewer> {
  const viewer = await getViewerFromHeaders(request.headers);
  if (!viewer) throw new AppError("unauthenticated");
  return viewer;
}

/** Route handlers: the viewer in one of the roles, or 401/403. */
export async function requireRole(request: Request, ...allowed: Role[]): Promise<Viewer> {
  const viewer = await requireUser(request);
  assertRole(viewer, ...allowed);
  return viewer;
}

export function assertRole(viewer: Viewer, ...allowed: Role[]) {
  if (!allowed.includes(viewer.role)) throw new AppError("forbidden");
  assertSecondFactor(viewer);
}

/**
 * Staff of an organisation that requires two-step sign-in reach nothing until they have set it
 * up (the set-up itself goes through better-auth's own endpoints).
 */
export function assertSecondFactor(viewer: Viewer) {
  if (needsSecondFactorSetup(viewer)) throw new AppError("two_factor_required");
}

/**
 * The way a viewer reaches one patient's record. A patient the viewer may not see answers 404,
 * the same as one that does not exist, so identifiers reveal nothing (ASVS 8.2.2).
 */
export async function requirePatientAccess(viewer: Viewer, patientId: string): Promise<PatientAccessVia> {
  assertSecondFactor(viewer);
  if (!isUuid(patientId)) throw new AppError("not_found");
  const via = await findPatientAccess({ userId: viewer.userId, role: viewer.role, patientId });
  if (!via) throw new AppError("not_found");
  return via;
}

/** Staff only (care team or visit access): clinical writes and staff views. */
export async function requireStaffPatientAccess(viewer: Viewer, patientId: string): Promise<PatientAccessVia> {
  assertRole(viewer, "clinician");
  return requirePatientAccess(viewer, patientId);
}

/** Portal route handlers: a patient or carer (staff are refused with 403). */
export async function requirePortalViewer(request: Request): Promise<Viewer> {
  return requireRole(request, "patient", "carer");
}

/**
 * The patient themselves or an actively linked carer, else 404. Staff reach the same data
 * through their own record pages, with their own audit.
 */
export async function requirePortalPatient(viewer: Viewer, patientId: string): Promise<"self" | "carer"> {
  assertRole(viewer, "patient", "carer");
  const via = await requirePatientAccess(viewer, patientId);
  if (via !== "self" && via !== "carer") throw new AppError("not_found");
  return via;
}

/** Inviting and removing carers: the patient themselves, or a clinician of the care team; carers and admins may not. */
export async function requireCarerManager(viewer: Viewer, patientId: string): Promise<"self" | "care_team"> {
  if (viewer.role === "patient") {
    const via = await requirePortalPatient(viewer, patientId);
    if (via !== "self") throw new AppError("not_found");
    return "self";
  }
  if (viewer.role === "clinician") {
    const via = await requireStaffPatientAccess(viewer, patientId);
    if (via !== "care_team") throw new AppError("forbidden");
    return "care_team";
  }
  throw new AppError("forbidden");
}

/** An admin of one of the patient's organisations (data export, audit search). */
export async function requireAdminOfPatient(viewer: Viewer, patientId: string) {
  assertRole(viewer, "admin");
  if (!isUuid(patientId) || !(await isAdminOfPatient({ userId: viewer.userId, patientId }))) {
    throw new AppError("not_found");
  }
}

/** Pages and layouts: the viewer in one of the roles; otherwise sign in, or a 403 page. */
export async function requirePageRole(locale: string, ...allowed: Role[]): Promise<Viewer> {
  const viewer = await getViewer();
  if (!viewer) redirect(`/${locale}/sign-in`);
  if (!allowed.includes(viewer.role)) forbidden();
  if (needsSecondFactorSetup(viewer)) redirect(`/${locale}/two-factor/setup`);
  return viewer;
}

export function isUuid(value: string): boolean {
  return /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(value);
}
