import "server-only";
// A person's own sessions (better-auth's session table), without their tokens.
import { and, desc, eq, gt, lt, sql } from "drizzle-orm";
import { isIP } from "node:net";
import { db, type Executor } from "@/db";
import { session } from "@/db/schema";

/** How stale "last used" may be: one write per session per 5 minutes at most. */
const SEEN_EVERY = sql`interval '5 minutes'`;

/** Records that a session was used just now, from this address and browser (at most every 5 minutes). */
export async function noteSessionUse({ sessionId, ipAddress, userAgent }: { sessionId: string; ipAddress: string; userAgent: string | null }, tx: Executor = db) {
  await tx
    .update(session)
    .set({
      lastSeenAt: sql`now()`,
      ...(isIP(ipAddress) ? { ipAddress } : {}),
      ...(userAgent ? { userAgent: userAgent.slice(0, 512) } : {}),
    })
    .where(and(eq(session.id, sessionId), lt(session.lastSeenAt, sql`now() - ${SEEN_EVERY}`)));
}

export type OwnSessionRow = { id: string; ipAddress: string | null; userAgent: string | null; createdAt: Date; lastSeenAt: Date; expiresAt: Date };

/** The user's sessions that have not expired, most recently used first. */
export async function listOwnSessions({ userId }: { userId: string }, tx: Executor = db): Promise<OwnSessionRow[]> {
  return tx
    .select({ id: session.id, ipAddress: session.ipAddress, userAgent: session.userAgent, createdAt: session.createdAt, lastSeenAt: session.lastSeenAt, expiresAt: session.expiresAt })
    .from(session)
    .where(and(eq(session.userId, userId), gt(session.expiresAt, sql`now()`)))
    .orderBy(desc(session.lastSeenAt));
}

/** The token of one of the user's own sessions, to end it through better-auth; null if not theirs. */
export async function ownSessionToken({ userId, sessionId }: { userId: string; sessionId: string }, tx: Executor = db) {
  const [row] = await tx.select({ token: session.token }).from(session).where(and(eq(session.id, sessionId), eq(session.userId, userId)));
  return row?.token ?? null;
}

/** Ends one session by id (a session past its absolute lifetime). */
export async function deleteSession({ sessionId }: { sessionId: string }, tx: Executor = db) {
  await tx.delete(session).where(eq(session.id, sessionId));
}
