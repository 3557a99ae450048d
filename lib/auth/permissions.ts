import "server-only";
// The one module of authorisation checks. Every route handler, page and server action calls
// these on the server; hiding a link in the menu is never the control.
import { forbidden, redirect } from "next/navigation";
import type { z } from "zod";
import { findPatientAccess, isAdminOfPatient, type PatientAccessVia } from "@/db/queries/access";
import type { DiaryEntry, Referral, Upload } from "@/db/schema";
import { AppError } from "@/lib/http/errors";
import { parseJsonBody } from "@/lib/http/validate";
import { DIARY_DELETE_HOURS } from "@/lib/validations/diary";
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

/** The care team's own acts (editing details, inviting, removing a file, the access log): visit access is not enough (403). */
export async function requireCareTeam(viewer: Viewer, patientId: string): Promise<"care_team"> {
  const via = await requireStaffPatientAccess(viewer, patientId);
  if (!isCareTeam(via)) throw new AppError("forbidden", "Only the patient's care team can do this.");
  return "care_team";
}

/**
 * Who may read a record's access log: its care team, and the patient themselves ("who looked at my
 * record"). Carers, admins and visiting clinicians are refused (403); another patient's record 404.
 */
export async function requireAccessLogReader(viewer: Viewer, patientId: string): Promise<"care_team" | "self"> {
  if (viewer.role === "clinician") return requireCareTeam(viewer, patientId);
  if (viewer.role !== "patient") throw new AppError("forbidden", "Only the patient and their care team can see who looked at the record.");
  if ((await requirePortalPatient(viewer, patientId)) !== "self") throw new AppError("not_found");
  return "self";
}

/** For pages that offer the care team's acts: whether the way in is the care team. */
export function isCareTeam(via: PatientAccessVia | null | undefined): via is "care_team" {
  return via === "care_team";
}

/**
 * Who may add files to this patient: staff through the care team (or visit access); the
 * patient themself or a linked carer, for site photos only (the portal reuses these routes).
 */
export async function requireUploadAccess(viewer: Viewer, patientId: string, category?: Upload["category"]): Promise<PatientAccessVia> {
  if (viewer.role === "clinician") return requireStaffPatientAccess(viewer, patientId);
  if (viewer.role === "patient" || viewer.role === "carer") {
    const via = await requirePatientAccess(viewer, patientId);
    if (category !== undefined && category !== "site-photo") {
      throw new AppError("forbidden", "Patients and carers can add site photos only.");
    }
    return via;
  }
  throw new AppError("forbidden");
}

/** Patients and carers finish only the uploads they started themselves (staff finish any). */
export function assertUploadStarter(viewer: Viewer, upload: Pick<Upload, "uploadedByUserId">) {
  if ((viewer.role === "patient" || viewer.role === "carer") && upload.uploadedByUserId !== viewer.userId) throw new AppError("not_found");
}

/** Reminders (bag, valve, change, drinks, check-in) are the patient's own choice; a carer sets her number and alerts only. */
export function mayChooseReminders(viewer: Viewer): boolean {
  return viewer.role === "patient";
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

/**
 * Portal routes whose patient travels in the body: the role (403), then that patient (404)
 * before the rest of the body is validated (400), so nobody learns about a record they cannot
 * see. A body whose patient is not an id at all names no record: it gets every field's error.
 */
export async function openPortalBody<S extends z.ZodType<{ patientId: string }>>(request: Request, schema: S) {
  const viewer = await requirePortalViewer(request);
  let via: "self" | "carer" | null = null;
  const input = await parseJsonBody(request, schema, {
    settleAccess: async (raw) => {
      const id = (raw as { patientId?: unknown } | null)?.patientId;
      if (typeof id === "string" && isUuid(id)) via = await requirePortalPatient(viewer, id);
    },
  });
  return { viewer, via: via ?? (await requirePortalPatient(viewer, input.patientId)), input };
}

/** The patient a body or a query names; a missing or malformed one is a 400 on that field. */
export function patientIdIn(data: unknown): string {
  const id = (data as { patientId?: unknown } | null)?.patientId;
  if (typeof id !== "string" || !isUuid(id)) throw new AppError("validation_failed", undefined, { fields: { patientId: ["invalid"] } });
  return id;
}

/** The diary's own rule: only who added an entry removes it, and only within 24 hours, so the diary the care team reads is not rewritten later. */
export function canRemoveDiaryEntry(entry: Pick<DiaryEntry, "recordedByUserId" | "createdAt">, userId: string, now = Date.now()): boolean {
  return entry.recordedByUserId === userId && now - entry.createdAt.getTime() <= DIARY_DELETE_HOURS * 3_600_000;
}

export async function requireDiaryEntryRemover(viewer: Viewer, entry: Pick<DiaryEntry, "patientId" | "recordedByUserId" | "createdAt">) {
  const via = await requirePortalPatient(viewer, entry.patientId);
  if (!canRemoveDiaryEntry(entry, viewer.userId)) throw new AppError("forbidden", "Only entries you added in the last 24 hours can be removed.");
  return via;
}

/**
 * Answering a referral (accept, decline): a clinician of the receiving organisation. The team is
 * not on the care team yet, so this is its only way to the referral; anyone else gets 404.
 */
export async function requireReferralReceiver(viewer: Viewer, referral: Pick<Referral, "toOrganisationId"> | null): Promise<void> {
  assertRole(viewer, "clinician");
  if (!referral || !viewer.organisationIds.includes(referral.toOrganisationId)) throw new AppError("not_found");
}

/** Taking one's own team off a care team: a clinician of the care team who belongs to that team (403 otherwise). */
export async function requireOwnCareTeamOrganisation(viewer: Viewer, patientId: string, organisationId: string): Promise<"care_team"> {
  const via = await requireCareTeam(viewer, patientId);
  if (!viewer.organisationIds.includes(organisationId)) throw new AppError("forbidden", "You can take only your own team off the care team.");
  return via;
}

/** An admin acts only on the organisations they belong to; another one is, to them, one that does not exist (404). */
export function assertManagesOrganisations(viewer: Viewer, organisationIds: readonly string[]) {
  if (organisationIds.some((id) => !viewer.organisationIds.includes(id))) throw new AppError("not_found");
}

/** Inviting and removing carers: the patient themselves, or a clinician of the care team; carers and admins may not. */
export async function requireCarerManager(viewer: Viewer, patientId: string): Promise<"self" | "care_team"> {
  if (viewer.role === "patient") {
    const via = await requirePortalPatient(viewer, patientId);
    if (via !== "self") throw new AppError("not_found");
    return "self";
  }
  if (viewer.role === "clinician") return requireCareTeam(viewer, patientId);
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
