import "server-only";
import { and, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { db } from "@/db";
import { careTeam, catheterEpisodes, checkIns, organisations, patients } from "@/db/schema";

/** What the portal's Today page needs for one patient the viewer may see. */
export async function getTodaySummary({ patientId }: { patientId: string }) {
  const [patient] = await db
    .select({ id: patients.id, givenName: patients.givenName, familyName: patients.familyName })
    .from(patients)
    .where(eq(patients.id, patientId));
  if (!patient) return null;
  const [episode] = await db
    .select({
      route: catheterEpisodes.route,
      sizeCh: catheterEpisodes.sizeCh,
      balloonMl: catheterEpisodes.balloonMl,
      insertedAt: catheterEpisodes.insertedAt,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
    })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
  // The latest by when it was answered (an offline one may arrive after a newer one).
  const [latest] = await db
    .select({ level: checkIns.level, answeredAt: checkIns.answeredAt, createdAt: checkIns.createdAt })
    .from(checkIns)
    .where(eq(checkIns.patientId, patientId))
    .orderBy(desc(sql`coalesce(${checkIns.answeredAt}, ${checkIns.createdAt})`))
    .limit(1);
  const lastCheckIn = latest ? { level: latest.level, at: latest.answeredAt ?? latest.createdAt } : undefined;
  const team = await db
    .select({ name: organisations.name, phone: organisations.phone, outOfHoursPhone: organisations.outOfHoursPhone })
    .from(organisations)
    .where(
      inArray(
        organisations.id,
        db.select({ id: careTeam.organisationId }).from(careTeam).where(eq(careTeam.patientId, patientId)),
      ),
    );
  return { patient, episode: episode ?? null, lastCheckIn: lastCheckIn ?? null, team };
}

/** My catheter: the device in place, in the words the patient page needs (no staff notes). */
export async function getMyCatheter({ patientId }: { patientId: string }) {
  const [episode] = await db
    .select({
      route: catheterEpisodes.route,
      catheterType: catheterEpisodes.catheterType,
      material: catheterEpisodes.material,
      lengthCategory: catheterEpisodes.lengthCategory,
      sizeCh: catheterEpisodes.sizeCh,
      balloonMl: catheterEpisodes.balloonMl,
      maker: catheterEpisodes.maker,
      insertedAt: catheterEpisodes.insertedAt,
      insertedByName: catheterEpisodes.insertedByName,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
      reviewDueOn: catheterEpisodes.reviewDueOn,
      awaitingTwoc: catheterEpisodes.awaitingTwoc,
    })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
  const [allergies] = await db
    .select({ latex: patients.allergyLatex, chlorhexidine: patients.allergyChlorhexidine, lidocaine: patients.allergyLidocaine, other: patients.allergyOther })
    .from(patients)
    .where(eq(patients.id, patientId));
  return { episode: episode ?? null, allergies: allergies ?? null };
}
