import "server-only";
// The passport's device card: what a stranger holding the QR may see, and nothing that names the
// patient (no name, date of birth, address or record number). One round trip, so the public card
// stays quick under load.
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import type { AllergyAnswers } from "@/lib/clinical";
import { careTeam, catheterEpisodes, organisations, patients, visitAccess } from "@/db/schema";

export type DeviceCard = {
  patientLocale: string;
  device: {
    route: (typeof catheterEpisodes.$inferSelect)["route"];
    catheterType: (typeof catheterEpisodes.$inferSelect)["catheterType"];
    material: (typeof catheterEpisodes.$inferSelect)["material"];
    lengthCategory: (typeof catheterEpisodes.$inferSelect)["lengthCategory"];
    sizeCh: number;
    balloonMl: number;
    gelKind: (typeof catheterEpisodes.$inferSelect)["gelKind"];
    insertedAt: string;
    plannedChangeOn: string;
  } | null;
  /** Only the allergies that matter for a catheter and its gel. */
  allergies: AllergyAnswers;
  careTeam: { phone: string | null; outOfHoursPhone: string | null } | null;
};

export async function getDeviceCard({ patientId }: { patientId: string }, tx: Executor = db): Promise<DeviceCard | null> {
  const episode = tx
    .select({
      route: catheterEpisodes.route,
      catheterType: catheterEpisodes.catheterType,
      material: catheterEpisodes.material,
      lengthCategory: catheterEpisodes.lengthCategory,
      sizeCh: catheterEpisodes.sizeCh,
      balloonMl: catheterEpisodes.balloonMl,
      gelKind: catheterEpisodes.gelKind,
      insertedAt: catheterEpisodes.insertedAt,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
    })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)))
    .orderBy(desc(catheterEpisodes.insertedAt))
    .limit(1)
    .as("e");
  // The care team with a phone first (a community team before a ward), by name.
  const team = tx
    .select({ phone: organisations.phone, outOfHoursPhone: organisations.outOfHoursPhone })
    .from(careTeam)
    .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
    .where(eq(careTeam.patientId, patientId))
    .orderBy(sql`${organisations.phone} is null`, sql`${organisations.kind} <> 'community_team'`, organisations.name)
    .limit(1)
    .as("t");
  const [row] = await tx
    .select({
      locale: patients.preferredLocale,
      latex: patients.allergyLatex,
      chlorhexidine: patients.allergyChlorhexidine,
      lidocaine: patients.allergyLidocaine,
      e: {
        route: episode.route,
        catheterType: episode.catheterType,
        material: episode.material,
        lengthCategory: episode.lengthCategory,
        sizeCh: episode.sizeCh,
        balloonMl: episode.balloonMl,
        gelKind: episode.gelKind,
        insertedAt: episode.insertedAt,
        plannedChangeOn: episode.plannedChangeOn,
      },
      t: { phone: team.phone, outOfHoursPhone: team.outOfHoursPhone },
    })
    .from(patients)
    .leftJoinLateral(episode, sql`true`)
    .leftJoinLateral(team, sql`true`)
    .where(eq(patients.id, patientId));
  if (!row) return null;
  const e = row.e && row.e.sizeCh !== null ? row.e : null;
  return {
    patientLocale: row.locale,
    device: e
      ? {
          route: e.route!,
          catheterType: e.catheterType!,
          material: e.material!,
          lengthCategory: e.lengthCategory!,
          sizeCh: e.sizeCh!,
          balloonMl: e.balloonMl!,
          gelKind: e.gelKind!,
          insertedAt: new Date(e.insertedAt!).toISOString(),
          plannedChangeOn: e.plannedChangeOn!,
        }
      : null,
    allergies: { latex: row.latex, chlorhexidine: row.chlorhexidine, lidocaine: row.lidocaine },
    careTeam: row.t && (row.t.phone || row.t.outOfHoursPhone) ? { phone: row.t.phone, outOfHoursPhone: row.t.outOfHoursPhone } : null,
  };
}

export async function grantVisitAccess(
  { patientId, userId, reason, hours }: { patientId: string; userId: string; reason: string; hours: number },
  tx: Executor = db,
) {
  const expiresAt = new Date(Date.now() + hours * 3600_000);
  const [row] = await tx.insert(visitAccess).values({ patientId, userId, reason, expiresAt }).returning({ id: visitAccess.id });
  return { id: row!.id, expiresAt };
}
