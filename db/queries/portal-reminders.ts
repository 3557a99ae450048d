import "server-only";
// Who may get the reminders they chose: patients with an open record and an account that is not
// deactivated, with their catheter in place (if any) for the device reminders.
import { and, eq, isNotNull, isNull } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { catheterEpisodes, patients, reachSettings, user } from "@/db/schema";

export async function listReminderPeople(tx: Executor = db) {
  return tx
    .select({
      userId: reachSettings.userId,
      patientId: patients.id,
      preferredLocale: patients.preferredLocale,
      email: user.email,
      phone: reachSettings.phone,
      smsConsentAt: reachSettings.smsConsentAt,
      quietStart: reachSettings.quietStart,
      quietEnd: reachSettings.quietEnd,
      reminders: reachSettings.reminders,
      updatedAt: reachSettings.updatedAt,
      // Null: no catheter in place (removed, trial without catheter): device reminders stop.
      episodeId: catheterEpisodes.id,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
    })
    .from(reachSettings)
    .innerJoin(patients, eq(patients.userId, reachSettings.userId))
    .innerJoin(user, eq(user.id, reachSettings.userId))
    .leftJoin(catheterEpisodes, and(eq(catheterEpisodes.patientId, patients.id), isNull(catheterEpisodes.removedAt)))
    .where(and(isNull(patients.closedAt), isNotNull(patients.userId), isNull(user.deactivatedAt)));
}
