import "server-only";
import { and, asc, eq, gt, inArray, isNull, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { invitationMailStates, type InvitationMailState } from "@/db/queries/admin-mail";
import {
  account,
  memberships,
  organisations,
  session,
  staffInvitationOrganisations,
  staffInvitations,
  user,
  type StaffRole,
} from "@/db/schema";

export type StaffOrganisation = { id: string; name: string; kind: "hospital_ward" | "community_team" | "gp_practice" };

export type StaffMember = {
  id: string;
  name: string;
  email: string;
  role: StaffRole;
  active: boolean;
  deactivatedAt: Date | null;
  twoFactorEnabled: boolean;
  /** Memberships among the organisations the viewing admin manages. */
  organisations: StaffOrganisation[];
  /** Memberships elsewhere (named to nobody who does not manage them). */
  otherOrganisationCount: number;
};

export type PendingInvitation = {
  id: string;
  email: string;
  name: string | null;
  role: StaffRole;
  expiresAt: Date;
  expired: boolean;
  organisations: StaffOrganisation[];
  /** The invitation e-mail in the outbox (null for an invitation made before e-mail was wired). */
  mail: InvitationMailState | null;
};

const staffRolesList: StaffRole[] = ["admin", "clinician"];

/** Staff who belong to at least one of `organisationIds`, with their memberships there. */
export async function listStaff(
  { organisationIds, userId }: { organisationIds: string[]; userId?: string },
  tx: Executor = db,
): Promise<StaffMember[]> {
  if (organisationIds.length === 0) return [];
  const rows = await tx
    .select({
      id: user.id,
      name: user.name,
      email: user.email,
      role: user.role,
      deactivatedAt: user.deactivatedAt,
      twoFactorEnabled: user.twoFactorEnabled,
      orgId: memberships.organisationId,
      orgName: organisations.name,
      orgKind: organisations.kind,
    })
    .from(user)
    .innerJoin(memberships, eq(memberships.userId, user.id))
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(
      and(
        inArray(user.role, staffRolesList),
        inArray(
          user.id,
          tx.select({ id: memberships.userId }).from(memberships).where(inArray(memberships.organisationId, organisationIds)),
        ),
        userId ? eq(user.id, userId) : undefined,
      ),
    )
    .orderBy(asc(user.name), asc(organisations.name));
  const byId = new Map<string, StaffMember>();
  for (const r of rows) {
    let m = byId.get(r.id);
    if (!m) {
      m = {
        id: r.id,
        name: r.name,
        email: r.email,
        role: r.role as StaffRole,
        active: !r.deactivatedAt,
        deactivatedAt: r.deactivatedAt,
        twoFactorEnabled: r.twoFactorEnabled,
        organisations: [],
        otherOrganisationCount: 0,
      };
      byId.set(r.id, m);
    }
    if (organisationIds.includes(r.orgId)) m.organisations.push({ id: r.orgId, name: r.orgName, kind: r.orgKind });
    else m.otherOrganisationCount++;
  }
  return [...byId.values()];
}

export async function getStaffMember({ userId, organisationIds }: { userId: string; organisationIds: string[] }, tx: Executor = db) {
  const [m] = await listStaff({ organisationIds, userId }, tx);
  return m ?? null;
}

/** Open invitations (not accepted, not withdrawn) to at least one of `organisationIds`. */
export async function listPendingInvitations({ organisationIds }: { organisationIds: string[] }, tx: Executor = db) {
  if (organisationIds.length === 0) return [] as PendingInvitation[];
  const rows = await tx
    .select({
      id: staffInvitations.id,
      email: staffInvitations.email,
      name: staffInvitations.name,
      role: staffInvitations.role,
      expiresAt: staffInvitations.expiresAt,
      orgId: organisations.id,
      orgName: organisations.name,
      orgKind: organisations.kind,
    })
    .from(staffInvitations)
    .innerJoin(staffInvitationOrganisations, eq(staffInvitationOrganisations.invitationId, staffInvitations.id))
    .innerJoin(organisations, eq(organisations.id, staffInvitationOrganisations.organisationId))
    .where(
      and(
        isNull(staffInvitations.acceptedAt),
        isNull(staffInvitations.revokedAt),
        inArray(
          staffInvitations.id,
          tx
            .select({ id: staffInvitationOrganisations.invitationId })
            .from(staffInvitationOrganisations)
            .where(inArray(staffInvitationOrganisations.organisationId, organisationIds)),
        ),
      ),
    )
    .orderBy(asc(staffInvitations.createdAt), asc(organisations.name));
  const byId = new Map<string, PendingInvitation>();
  const now = Date.now();
  for (const r of rows) {
    let i = byId.get(r.id);
    if (!i) {
      i = { id: r.id, email: r.email, name: r.name, role: r.role, expiresAt: r.expiresAt, expired: r.expiresAt.getTime() <= now, organisations: [], mail: null };
      byId.set(r.id, i);
    }
    if (organisationIds.includes(r.orgId)) i.organisations.push({ id: r.orgId, name: r.orgName, kind: r.orgKind });
  }
  const mail = await invitationMailStates({ invitationIds: [...byId.keys()] }, tx);
  for (const i of byId.values()) i.mail = mail.get(i.id) ?? null;
  return [...byId.values()];
}

export async function findUserByEmail({ email }: { email: string }, tx: Executor = db) {
  const [row] = await tx.select({ id: user.id }).from(user).where(sql`lower(${user.email}) = ${email.toLowerCase()}`);
  return row ?? null;
}

/** Open invitations to this address, for replacing an expired one. */
export async function findOpenInvitations({ email }: { email: string }, tx: Executor = db) {
  return tx
    .select({ id: staffInvitations.id, expiresAt: staffInvitations.expiresAt })
    .from(staffInvitations)
    .where(
      and(
        sql`lower(${staffInvitations.email}) = ${email.toLowerCase()}`,
        isNull(staffInvitations.acceptedAt),
        isNull(staffInvitations.revokedAt),
      ),
    );
}

export async function insertInvitation(
  {
    values,
    organisationIds,
  }: {
    values: { email: string; name: string | null; role: StaffRole; tokenHash: string; expiresAt: Date; invitedByUserId: string };
    organisationIds: string[];
  },
  tx: Executor,
) {
  const [row] = await tx.insert(staffInvitations).values(values).returning({ id: staffInvitations.id });
  await tx.insert(staffInvitationOrganisations).values(organisationIds.map((organisationId) => ({ invitationId: row.id, organisationId })));
  return row;
}

export async function revokeInvitation({ id }: { id: string }, tx: Executor) {
  await tx.update(staffInvitations).set({ revokedAt: new Date() }).where(eq(staffInvitations.id, id));
}

/** An open, unexpired invitation by its token's hash (locked for update inside a transaction). */
export async function findInvitationByTokenHash({ tokenHash, forUpdate = false }: { tokenHash: string; forUpdate?: boolean }, tx: Executor = db) {
  const q = tx
    .select({
      id: staffInvitations.id,
      email: staffInvitations.email,
      name: staffInvitations.name,
      role: staffInvitations.role,
      expiresAt: staffInvitations.expiresAt,
    })
    .from(staffInvitations)
    .where(
      and(
        eq(staffInvitations.tokenHash, tokenHash),
        isNull(staffInvitations.acceptedAt),
        isNull(staffInvitations.revokedAt),
        gt(staffInvitations.expiresAt, new Date()),
      ),
    );
  const [row] = forUpdate ? await q.for("update") : await q;
  if (!row) return null;
  const orgs = await tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
    .from(staffInvitationOrganisations)
    .innerJoin(organisations, eq(organisations.id, staffInvitationOrganisations.organisationId))
    .where(eq(staffInvitationOrganisations.invitationId, row.id))
    .orderBy(organisations.name);
  return { ...row, organisations: orgs };
}

export async function createStaffAccount(
  { id, email, name, role, locale, passwordHash }: { id: string; email: string; name: string; role: StaffRole; locale: string; passwordHash: string },
  tx: Executor,
) {
  await tx.insert(user).values({ id, email, name, role, locale, emailVerified: true });
  await tx.insert(account).values({ id: crypto.randomUUID(), userId: id, accountId: id, providerId: "credential", password: passwordHash });
}

export async function markInvitationAccepted({ id, userId }: { id: string; userId: string }, tx: Executor) {
  await tx.update(staffInvitations).set({ acceptedAt: new Date(), acceptedUserId: userId }).where(eq(staffInvitations.id, id));
}

export async function addMemberships({ userId, organisationIds }: { userId: string; organisationIds: string[] }, tx: Executor) {
  if (organisationIds.length === 0) return;
  await tx
    .insert(memberships)
    .values(organisationIds.map((organisationId) => ({ userId, organisationId })))
    .onConflictDoNothing();
}

export async function removeMemberships({ userId, organisationIds }: { userId: string; organisationIds: string[] }, tx: Executor) {
  if (organisationIds.length === 0) return;
  await tx.delete(memberships).where(and(eq(memberships.userId, userId), inArray(memberships.organisationId, organisationIds)));
}

export async function countMemberships({ userId }: { userId: string }, tx: Executor) {
  const [{ n }] = await tx.select({ n: sql<number>`count(*)::int` }).from(memberships).where(eq(memberships.userId, userId));
  return n;
}

export async function setRole({ userId, role }: { userId: string; role: StaffRole }, tx: Executor) {
  await tx.update(user).set({ role, updatedAt: new Date() }).where(eq(user.id, userId));
}

/** Deactivation: the account is marked and every session it has ends now (ASVS 7.4.2). */
export async function deactivateUser({ userId }: { userId: string }, tx: Executor) {
  await tx.update(user).set({ deactivatedAt: new Date(), updatedAt: new Date() }).where(eq(user.id, userId));
  return endAllSessions({ userId }, tx);
}

/** Every session of an account ends now: its cookies are refused on their next request. */
export async function endAllSessions({ userId }: { userId: string }, tx: Executor) {
  const ended = await tx.delete(session).where(eq(session.userId, userId)).returning({ id: session.id });
  return { sessionsEnded: ended.length };
}

export async function reactivateUser({ userId }: { userId: string }, tx: Executor) {
  await tx.update(user).set({ deactivatedAt: null, updatedAt: new Date() }).where(eq(user.id, userId));
}

/**
 * The admin roster: active admins of the deployment, and each organisation's active admins.
 * Read under a transaction-scoped advisory lock so two admins changing roles at once are
 * serialised and cannot both remove "the other" last admin.
 */
export async function lockAdminRoster(tx: Executor) {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtext('caddis:admin-roster'))`);
}

/** The organisations of an active admin, read now (null when they are no longer an active admin). */
export async function currentAdminOrganisationIds({ userId }: { userId: string }, tx: Executor) {
  const [u] = await tx.select({ role: user.role, deactivatedAt: user.deactivatedAt }).from(user).where(eq(user.id, userId));
  if (!u || u.role !== "admin" || u.deactivatedAt) return null;
  const rows = await tx.select({ id: memberships.organisationId }).from(memberships).where(eq(memberships.userId, userId));
  return rows.map((r) => r.id);
}

export async function adminRoster(tx: Executor) {
  const admins = await tx
    .select({ id: user.id })
    .from(user)
    .where(and(eq(user.role, "admin"), isNull(user.deactivatedAt)));
  const perOrg = await tx
    .select({ organisationId: memberships.organisationId, n: sql<number>`count(*)::int` })
    .from(memberships)
    .innerJoin(user, eq(user.id, memberships.userId))
    .where(and(eq(user.role, "admin"), isNull(user.deactivatedAt)))
    .groupBy(memberships.organisationId);
  return { total: admins.length, organisationsWithAdmins: new Set(perOrg.filter((r) => r.n > 0).map((r) => r.organisationId)) };
}
