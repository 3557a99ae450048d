import "server-only";
import { and, eq, gt } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, carerLinks, memberships, organisations, patients, user, visitAccess } from "@/db/schema";

export type Role = "admin" | "clinician" | "patient" | "carer";

/** Organisations a staff user belongs to. */
export async function getMembershipOrganisationIds({ userId }: { userId: string }, tx: Executor = db) {
  const rows = await tx
    .select({ id: memberships.organisationId })
    .from(memberships)
    .where(eq(memberships.userId, userId));
  return rows.map((r) => r.id);
}

/** A staff user's organisations, with whether each requires two-step sign-in. */
export async function getMemberships({ userId }: { userId: string }, tx: Executor = db) {
  return tx
    .select({ organisationId: memberships.organisationId, requireTwoFactor: organisations.requireTwoFactor })
    .from(memberships)
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(eq(memberships.userId, userId));
}

/**
 * Staff sign in in two steps unless every organisation they belong to has relaxed it; a member of
 * staff of no organisation needs it too (the default holds until an admin says otherwise).
 */
export function secondFactorRequired(memberships: { requireTwoFactor: boolean }[]): boolean {
  return memberships.length === 0 || memberships.some((m) => m.requireTwoFactor);
}

/** Whether this account must keep two-step sign-in on (staff, by their organisations). */
export async function twoFactorRequiredFor({ userId }: { userId: string }, tx: Executor = db) {
  const [u] = await tx.select({ role: user.role }).from(user).where(eq(user.id, userId));
  if (u?.role !== "admin" && u?.role !== "clinician") return false;
  return secondFactorRequired(await getMemberships({ userId }, tx));
}

/** The patients a patient (themselves) or a carer (active links only) may see. */
export async function getOwnPatientIds({ userId, role }: { userId: string; role: Role }, tx: Executor = db) {
  if (role === "patient") {
    const rows = await tx.select({ id: patients.id }).from(patients).where(eq(patients.userId, userId));
    return rows.map((r) => r.id);
  }
  if (role === "carer") {
    const rows = await tx
      .select({ id: carerLinks.patientId })
      .from(carerLinks)
      .where(and(eq(carerLinks.carerUserId, userId), eq(carerLinks.status, "active")));
    return rows.map((r) => r.id);
  }
  return [];
}

export type PatientAccessVia = "care_team" | "visit_access" | "self" | "carer";

/**
 * How (if at all) a viewer reaches a patient: through the care team of one of their
 * organisations, through time-limited visit access, as the patient, or as a linked carer.
 */
export async function findPatientAccess(
  { userId, role, patientId }: { userId: string; role: Role; patientId: string },
  tx: Executor = db,
): Promise<PatientAccessVia | null> {
  if (role === "clinician") {
    const team = await tx
      .select({ one: careTeam.patientId })
      .from(careTeam)
      .innerJoin(memberships, eq(memberships.organisationId, careTeam.organisationId))
      .where(and(eq(careTeam.patientId, patientId), eq(memberships.userId, userId)))
      .limit(1);
    if (team.length) return "care_team";
    const visit = await tx
      .select({ id: visitAccess.id })
      .from(visitAccess)
      .where(and(eq(visitAccess.patientId, patientId), eq(visitAccess.userId, userId), gt(visitAccess.expiresAt, new Date())))
      .limit(1);
    return visit.length ? "visit_access" : null;
  }
  if (role === "patient") {
    const own = await tx
      .select({ id: patients.id })
      .from(patients)
      .where(and(eq(patients.id, patientId), eq(patients.userId, userId)))
      .limit(1);
    return own.length ? "self" : null;
  }
  if (role === "carer") {
    const link = await tx
      .select({ id: carerLinks.id })
      .from(carerLinks)
      .where(and(eq(carerLinks.patientId, patientId), eq(carerLinks.carerUserId, userId), eq(carerLinks.status, "active")))
      .limit(1);
    return link.length ? "carer" : null;
  }
  return null;
}

/** True when an admin belongs to one of the patient's care-team organisations. */
export async function isAdminOfPatient({ userId, patientId }: { userId: string; patientId: string }, tx: Executor = db) {
  const rows = await tx
    .select({ one: careTeam.patientId })
    .from(careTeam)
    .innerJoin(memberships, eq(memberships.organisationId, careTeam.organisationId))
    .where(and(eq(careTeam.patientId, patientId), eq(memberships.userId, userId)))
    .limit(1);
  return rows.length > 0;
}

export async function listOrganisationsForUser({ userId }: { userId: string }, tx: Executor = db) {
  return tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind, parentName: organisations.parentName })
    .from(organisations)
    .innerJoin(memberships, eq(memberships.organisationId, organisations.id))
    .where(eq(memberships.userId, userId))
    .orderBy(organisations.name);
}

