import "server-only";
// Who gets a reminder that their catheter change is near: open patients with a portal account
// that is not deactivated (its e-mail is where the reminder goes) and a catheter in place whose planned change
// falls in the window.
import { and, asc, between, eq, isNotNull, isNull } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { catheterEpisodes, patients, user } from "@/db/schema";

export async function listChangeReminders({ from, until }: { from: string; until: string }, tx: Executor = db) {
  return tx
    .select({
      patientId: patients.id,
      episodeId: catheterEpisodes.id,
      givenName: patients.givenName,
      preferredLocale: patients.preferredLocale,
      email: user.email,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
    })
    .from(catheterEpisodes)
    .innerJoin(patients, eq(patients.id, catheterEpisodes.patientId))
    .innerJoin(user, eq(user.id, patients.userId))
    .where(
      and(
        isNull(catheterEpisodes.removedAt),
        isNull(patients.closedAt),
        isNotNull(patients.userId),
        isNull(user.deactivatedAt),
        between(catheterEpisodes.plannedChangeOn, from, until),
      ),
    )
    .orderBy(asc(catheterEpisodes.plannedChangeOn));
}
