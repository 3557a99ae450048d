import "server-only";
import { randomUUID } from "node:crypto";
import { and, desc, eq, gt, inArray, isNull, ne, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { account, carerLinks, patientInvites, patients, user } from "@/db/schema";

// ── patient activation codes ───────────────────────────────────────────────────────────────

export async function revokeLivePatientInvites({ patientId }: { patientId: string }, tx: Executor = db) {
  await tx
    .update(patientInvites)
    .set({ revokedAt: new Date() })
    .where(and(eq(patientInvites.patientId, patientId), isNull(patientInvites.usedAt), isNull(patientInvites.revokedAt)));
}

export async function insertPatientInvite(
  values: { patientId: string; codeHash: string; email: string | null; createdByUserId: string; expiresAt: Date },
  tx: Executor = db,
) {
  const [row] = await tx.insert(patientInvites).values(values).returning({ id: patientInvites.id, expiresAt: patientInvites.expiresAt });
  return row;
}

/** A live (unused, unrevoked, unexpired) code, locked for the activation transaction. */
export async function findLivePatientInviteForUpdate({ codeHash }: { codeHash: string }, tx: Executor) {
  const [row] = await tx
    .select()
    .from(patientInvites)
    .where(and(eq(patientInvites.codeHash, codeHash), isNull(patientInvites.usedAt), isNull(patientInvites.revokedAt), gt(patientInvites.expiresAt, new Date())))
    .for("update");
  return row ?? null;
}

export async function markPatientInviteUsed({ id }: { id: string }, tx: Executor) {
  await tx.update(patientInvites).set({ usedAt: new Date() }).where(eq(patientInvites.id, id));
}

export async function getPatientForInvite({ patientId }: { patientId: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ id: patients.id, userId: patients.userId, givenName: patients.givenName, familyName: patients.familyName, preferredLocale: patients.preferredLocale, closedAt: patients.closedAt })
    .from(patients)
    .where(eq(patients.id, patientId));
  return row ?? null;
}

/** Links a new patient account; false when the record already has one (a race lost). */
export async function linkPatientUser({ patientId, userId }: { patientId: string; userId: string }, tx: Executor) {
  const rows = await tx
    .update(patients)
    .set({ userId })
    .where(and(eq(patients.id, patientId), isNull(patients.userId)))
    .returning({ id: patients.id });
  return rows.length === 1;
}

// ── accounts ───────────────────────────────────────────────────────────────────────────────

export async function findUserByEmail({ email }: { email: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ id: user.id, email: user.email, name: user.name, role: user.role, deactivatedAt: user.deactivatedAt })
    .from(user)
    .where(eq(sql`lower(${user.email})`, email.toLowerCase()));
  return row ?? null;
}

/** An e-mail + password account made by invitation (self sign-up is off in lib/auth/index.ts). */
export async function createCredentialUser(
  { email, name, role, locale, passwordHash }: { email: string; name: string; role: "patient" | "carer"; locale: string; passwordHash: string },
  tx: Executor,
) {
  const id = randomUUID();
  await tx.insert(user).values({ id, email: email.toLowerCase(), name, role, locale, emailVerified: true });
  await tx.insert(account).values({ id: randomUUID(), userId: id, accountId: id, providerId: "credential", password: passwordHash });
  return id;
}

// ── carer links ────────────────────────────────────────────────────────────────────────────

export type CarerLinkDto = {
  id: string;
  email: string;
  name: string | null;
  status: "pending" | "active" | "revoked";
  invitedAt: string;
  acceptedAt: string | null;
  inviteExpired: boolean;
};

export async function listCarerLinks({ patientId }: { patientId: string }, tx: Executor = db): Promise<CarerLinkDto[]> {
  const rows = await tx
    .select({
      id: carerLinks.id,
      email: carerLinks.invitedEmail,
      name: user.name,
      status: carerLinks.status,
      createdAt: carerLinks.createdAt,
      acceptedAt: carerLinks.acceptedAt,
      inviteExpiresAt: carerLinks.inviteExpiresAt,
    })
    .from(carerLinks)
    .leftJoin(user, eq(user.id, carerLinks.carerUserId))
    .where(and(eq(carerLinks.patientId, patientId), ne(carerLinks.status, "revoked")))
    .orderBy(desc(carerLinks.createdAt));
  const now = Date.now();
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    name: r.name,
    status: r.status,
    invitedAt: r.createdAt.toISOString(),
    acceptedAt: r.acceptedAt ? r.acceptedAt.toISOString() : null,
    inviteExpired: r.status === "pending" && (!r.inviteExpiresAt || r.inviteExpiresAt.getTime() <= now),
  }));
}

export async function findOpenCarerLinks({ patientId, email }: { patientId: string; email: string }, tx: Executor = db) {
  return tx
    .select({ id: carerLinks.id, status: carerLinks.status })
    .from(carerLinks)
    .where(and(eq(carerLinks.patientId, patientId), eq(sql`lower(${carerLinks.invitedEmail})`, email.toLowerCase()), inArray(carerLinks.status, ["pending", "active"])));
}

export async function insertCarerLink(
  values: { patientId: string; invitedEmail: string; invitedByUserId: string; inviteTokenHash: string; inviteExpiresAt: Date },
  tx: Executor = db,
) {
  const [row] = await tx.insert(carerLinks).values({ ...values, status: "pending" }).returning({ id: carerLinks.id });
  return row;
}

export async function revokeCarerLink({ id, patientId }: { id: string; patientId: string }, tx: Executor = db) {
  const rows = await tx
    .update(carerLinks)
    .set({ status: "revoked", revokedAt: new Date(), inviteTokenHash: null })
    .where(and(eq(carerLinks.id, id), eq(carerLinks.patientId, patientId), ne(carerLinks.status, "revoked")))
    .returning({ id: carerLinks.id, carerUserId: carerLinks.carerUserId, status: carerLinks.status });
  return rows[0] ?? null;
}

/** A pending, unexpired invitation by its token hash, with the names the accept page shows. */
export async function findPendingCarerInvite({ tokenHash }: { tokenHash: string }, tx: Executor = db) {
  const [row] = await tx
    .select({
      id: carerLinks.id,
      patientId: carerLinks.patientId,
      invitedEmail: carerLinks.invitedEmail,
      invitedByUserId: carerLinks.invitedByUserId,
      patientGivenName: patients.givenName,
      patientLocale: patients.preferredLocale,
    })
    .from(carerLinks)
    .innerJoin(patients, eq(patients.id, carerLinks.patientId))
    .where(and(eq(carerLinks.inviteTokenHash, tokenHash), eq(carerLinks.status, "pending"), gt(carerLinks.inviteExpiresAt, new Date())));
  return row ?? null;
}

export async function activateCarerLink({ id, carerUserId }: { id: string; carerUserId: string }, tx: Executor) {
  const rows = await tx
    .update(carerLinks)
    .set({ status: "active", carerUserId, acceptedAt: new Date(), inviteTokenHash: null })
    .where(and(eq(carerLinks.id, id), eq(carerLinks.status, "pending")))
    .returning({ id: carerLinks.id });
  return rows.length === 1;
}

/** The carer's own active link to the patient: whether she is told of urgent check-ins. */
export async function getCarerAlert({ patientId, carerUserId }: { patientId: string; carerUserId: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ on: carerLinks.alertOnUrgent, channel: carerLinks.alertChannel })
    .from(carerLinks)
    .where(and(eq(carerLinks.patientId, patientId), eq(carerLinks.carerUserId, carerUserId), eq(carerLinks.status, "active")));
  return row ?? null;
}

export async function setCarerAlert(
  { patientId, carerUserId, on, channel }: { patientId: string; carerUserId: string; on: boolean; channel?: "email" | "push" | "sms" },
  tx: Executor,
) {
  const rows = await tx
    .update(carerLinks)
    .set({ alertOnUrgent: on, ...(channel ? { alertChannel: channel } : {}), updatedAt: new Date() })
    .where(and(eq(carerLinks.patientId, patientId), eq(carerLinks.carerUserId, carerUserId), eq(carerLinks.status, "active")))
    .returning({ id: carerLinks.id });
  return rows.length > 0;
}

/** A carer's links that were removed, newest first, with the patient's first name: the screen that tells her why. */
export async function listRemovedCarerLinks({ carerUserId }: { carerUserId: string }, tx: Executor = db) {
  return tx
    .select({ givenName: patients.givenName, revokedAt: carerLinks.revokedAt })
    .from(carerLinks)
    .innerJoin(patients, eq(patients.id, carerLinks.patientId))
    .where(and(eq(carerLinks.carerUserId, carerUserId), eq(carerLinks.status, "revoked")))
    .orderBy(desc(carerLinks.revokedAt))
    .limit(5);
}
