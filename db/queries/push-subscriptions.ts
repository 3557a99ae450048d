import "server-only";
// Web Push subscriptions, one per browser a person allowed notifications in.
import { and, eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { pushSubscriptions } from "@/db/schema";

export async function listPushSubscriptions({ userId }: { userId: string }, tx: Executor = db) {
  return tx.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId));
}

export async function getPushSubscription({ id }: { id: string }, tx: Executor = db) {
  const [row] = await tx.select().from(pushSubscriptions).where(eq(pushSubscriptions.id, id));
  return row ?? null;
}

/** Stores (or moves to this person) the browser's subscription; the endpoint is unique. */
export async function savePushSubscription(
  { userId, endpoint, p256dh, auth }: { userId: string; endpoint: string; p256dh: string; auth: string },
  tx: Executor = db,
) {
  const [row] = await tx
    .insert(pushSubscriptions)
    .values({ userId, endpoint, p256dh, auth })
    .onConflictDoUpdate({ target: pushSubscriptions.endpoint, set: { userId, p256dh, auth, updatedAt: new Date() } })
    .returning({ id: pushSubscriptions.id });
  return row;
}

/** The person's own subscription only: another person's endpoint is left alone. */
export async function deletePushSubscription({ userId, endpoint }: { userId: string; endpoint: string }, tx: Executor = db) {
  const rows = await tx
    .delete(pushSubscriptions)
    .where(and(eq(pushSubscriptions.userId, userId), eq(pushSubscriptions.endpoint, endpoint)))
    .returning({ id: pushSubscriptions.id });
  return rows.length;
}

/** The push service said 404/410: the browser dropped it. */
export async function removeGoneSubscription({ id }: { id: string }, tx: Executor = db) {
  await tx.delete(pushSubscriptions).where(eq(pushSubscriptions.id, id));
}
