import "server-only";
// What an admin sees of failed sign-ins (lib/auth/sign-in-throttle.ts): the accounts of their
// organisations that are being guessed at, and how many tries went to e-mail addresses with no
// account at all (a sign of credential stuffing). Never the addresses themselves.
import { and, desc, eq, gt, inArray, isNull, or, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, carerLinks, memberships, patients, signInThrottles, user } from "@/db/schema";

export type AccountUnderAttack = {
  userId: string;
  name: string;
  email: string;
  role: "admin" | "clinician" | "patient" | "carer";
  failedAttempts: number;
  heldAttempts: number;
  secondStepFailures: number;
  places: number;
  windowStartedAt: Date;
  lastAttemptAt: Date;
  heldUntil: Date | null;
  notifiedAt: Date | null;
};

/** An account is listed when it had this many tries in the last 24 h, or is being held back now. */
export const UNDER_ATTACK_ATTEMPTS = 10;

/**
 * Accounts the admin looks after — staff of their organisations, patients in those
 * organisations' care teams, and those patients' carers — with failed sign-ins in the last 24 h
 * (at least UNDER_ATTACK_ATTEMPTS, or held back now), most recent first.
 */
export async function accountsUnderAttack({ organisationIds }: { organisationIds: string[] }, tx: Executor = db): Promise<AccountUnderAttack[]> {
  if (organisationIds.length === 0) return [];
  const staff = tx.select({ id: memberships.userId }).from(memberships).where(inArray(memberships.organisationId, organisationIds));
  const theirPatients = tx.select({ id: careTeam.patientId }).from(careTeam).where(inArray(careTeam.organisationId, organisationIds));
  const patientAccounts = tx.select({ id: patients.userId }).from(patients).where(inArray(patients.id, theirPatients));
  const carers = tx.select({ id: carerLinks.carerUserId }).from(carerLinks).where(inArray(carerLinks.patientId, theirPatients));
  const rows = await tx
    .select({
      userId: user.id,
      name: user.name,
      email: user.email,
      role: user.role,
      failedAttempts: signInThrottles.failedAttempts,
      heldAttempts: signInThrottles.heldAttempts,
      secondStepFailures: signInThrottles.secondStepFailures,
      places: sql<number>`cardinality(${signInThrottles.addressHashes})`,
      windowStartedAt: signInThrottles.windowStartedAt,
      lastAttemptAt: signInThrottles.lastAttemptAt,
      blockedUntil: signInThrottles.blockedUntil,
      notifiedAt: signInThrottles.notifiedAt,
    })
    .from(signInThrottles)
    .innerJoin(user, eq(user.id, signInThrottles.userId))
    .where(
      and(
        gt(signInThrottles.lastAttemptAt, sql`now() - interval '24 hours'`),
        or(
          sql`${signInThrottles.failedAttempts} + ${signInThrottles.heldAttempts} >= ${UNDER_ATTACK_ATTEMPTS}`,
          gt(signInThrottles.blockedUntil, sql`now()`),
        ),
        or(inArray(user.id, staff), inArray(user.id, patientAccounts), inArray(user.id, carers)),
      ),
    )
    .orderBy(desc(signInThrottles.lastAttemptAt));
  const now = Date.now();
  return rows.map(({ blockedUntil, ...r }) => ({
    ...r,
    places: Number(r.places),
    heldUntil: blockedUntil && blockedUntil.getTime() > now ? blockedUntil : null,
  }));
}

/** Tries in the last 24 h on e-mail addresses that have no account, in all. */
export async function attemptsOnUnknownAccounts(tx: Executor = db) {
  const [row] = await tx
    .select({
      addresses: sql<number>`count(*)::int`,
      attempts: sql<number>`coalesce(sum(${signInThrottles.failedAttempts} + ${signInThrottles.heldAttempts}), 0)::int`,
    })
    .from(signInThrottles)
    .where(and(isNull(signInThrottles.userId), gt(signInThrottles.lastAttemptAt, sql`now() - interval '24 hours'`)));
  return { emailAddresses: Number(row?.addresses ?? 0), attempts: Number(row?.attempts ?? 0) };
}
