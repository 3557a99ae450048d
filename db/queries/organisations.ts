import "server-only";
import { and, count, eq, inArray, isNull, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { memberships, organisations, user, type NewOrganisation } from "@/db/schema";

export type OrganisationSummary = {
  id: string;
  name: string;
  kind: "hospital_ward" | "community_team" | "gp_practice";
  parentName: string | null;
  phone: string | null;
  inboxEmail: string | null;
  staffCount: number;
};

/** The organisations an admin manages, with their staff counts. */
export async function listOrganisationsManagedBy({ organisationIds }: { organisationIds: string[] }): Promise<OrganisationSummary[]> {
  if (organisationIds.length === 0) return [];
  const rows = await db
    .select({
      id: organisations.id,
      name: organisations.name,
      kind: organisations.kind,
      parentName: organisations.parentName,
      phone: organisations.phone,
      inboxEmail: organisations.inboxEmail,
      // Active staff only: a deactivated account still has its memberships (for the record) but is nobody's colleague.
      staffCount: count(user.id),
    })
    .from(organisations)
    .leftJoin(memberships, eq(memberships.organisationId, organisations.id))
    .leftJoin(user, and(eq(user.id, memberships.userId), isNull(user.deactivatedAt)))
    .where(inArray(organisations.id, organisationIds))
    .groupBy(organisations.id)
    .orderBy(organisations.name);
  return rows.map((r) => ({ ...r, staffCount: Number(r.staffCount) }));
}

export async function listGpPractices() {
  return db
    .select({ id: organisations.id, name: organisations.name, phone: organisations.phone })
    .from(organisations)
    .where(eq(organisations.kind, "gp_practice"))
    .orderBy(organisations.name);
}

export type OrganisationDetail = {
  id: string;
  name: string;
  kind: "hospital_ward" | "community_team" | "gp_practice";
  parentName: string | null;
  phone: string | null;
  outOfHoursPhone: string | null;
  inboxEmail: string | null;
  locale: string;
  languages: string[];
  requireTwoFactor: boolean;
  /** When two-step sign-in is relaxed: why, by whom, when. */
  twoFactorRelaxedReason: string | null;
  twoFactorRelaxedAt: Date | null;
  twoFactorRelaxedByName: string | null;
  updatedAt: Date;
};

const detailColumns = {
  id: organisations.id,
  name: organisations.name,
  kind: organisations.kind,
  parentName: organisations.parentName,
  phone: organisations.phone,
  outOfHoursPhone: organisations.outOfHoursPhone,
  inboxEmail: organisations.inboxEmail,
  locale: organisations.locale,
  languages: organisations.languages,
  requireTwoFactor: organisations.requireTwoFactor,
  twoFactorRelaxedReason: organisations.twoFactorRelaxedReason,
  twoFactorRelaxedAt: organisations.twoFactorRelaxedAt,
  twoFactorRelaxedByName: sql<string | null>`(select u.name from "user" u where u.id = ${organisations.twoFactorRelaxedByUserId})`,
  updatedAt: organisations.updatedAt,
};

/**
 * The two-step sign-in columns for a change of policy: requiring it clears the record of the
 * relaxation; relaxing it records the reason, who and when (kept as it was when nothing changed).
 */
export function twoFactorPolicyValues(
  input: { requireTwoFactor?: boolean; twoFactorRelaxedReason?: string | null },
  { actorUserId, before }: { actorUserId: string; before?: Pick<OrganisationDetail, "requireTwoFactor" | "twoFactorRelaxedReason"> | null },
): Partial<NewOrganisation> {
  if (input.requireTwoFactor === undefined) return {};
  if (input.requireTwoFactor) return { requireTwoFactor: true, twoFactorRelaxedReason: null, twoFactorRelaxedByUserId: null, twoFactorRelaxedAt: null };
  const reason = input.twoFactorRelaxedReason ?? null;
  if (before && !before.requireTwoFactor && before.twoFactorRelaxedReason === reason) return {};
  return { requireTwoFactor: false, twoFactorRelaxedReason: reason, twoFactorRelaxedByUserId: actorUserId, twoFactorRelaxedAt: new Date() };
}

/** One organisation, only if it is among `organisationIds` (the admin's own). */
export async function getManagedOrganisation(
  { id, organisationIds }: { id: string; organisationIds: string[] },
  tx: Executor = db,
): Promise<OrganisationDetail | null> {
  if (!organisationIds.includes(id)) return null;
  const [row] = await tx.select(detailColumns).from(organisations).where(eq(organisations.id, id));
  return row ?? null;
}

export async function insertOrganisation({ values, creatorUserId }: { values: NewOrganisation; creatorUserId: string }, tx: Executor) {
  const [row] = await tx.insert(organisations).values(values).returning(detailColumns);
  // The admin who creates an organisation becomes its member, so they manage it.
  await tx.insert(memberships).values({ userId: creatorUserId, organisationId: row.id });
  return row;
}

export async function updateOrganisation({ id, values }: { id: string; values: Partial<NewOrganisation> }, tx: Executor) {
  const [row] = await tx.update(organisations).set(values).where(eq(organisations.id, id)).returning(detailColumns);
  return row ?? null;
}

/** Names of organisations, by id (for invitations and audit rows). */
export async function organisationNames({ ids }: { ids: string[] }, tx: Executor = db) {
  if (ids.length === 0) return [];
  return tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
    .from(organisations)
    .where(inArray(organisations.id, ids))
    .orderBy(organisations.name);
}
