import "server-only";
// The passport's device card: what a stranger holding the QR may see, and nothing that names the
// patient (no name, date of birth, address or record number). One round trip, so the public card
// stays quick under load.
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import type { AllergyAnswers } from "@/lib/clinical";
import { catheterEpisodes, dischargeChecklists, patients, visitAccess } from "@/db/schema";
import { getLeadTeamContact } from "./contacts";
import { getLastRemoval, type LastRemoval } from "./episodes";

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
    /** What an out-of-hours nurse needs before recatheterising. */
    lot: string | null;
    expiry: string | null;
    /** More than one attempt, or difficulties noted, at the last insertion. */
    difficult: boolean;
    difficulties: string | null;
  } | null;
  /** Valve or free drainage into a bag, from the latest discharge checklist; null when not recorded. */
  drainage: "valve" | "bag" | null;
  /** Only the allergies that matter for a catheter and its gel. */
  allergies: AllergyAnswers;
  /** The lead team's numbers (getLeadTeamContact: out of hours falls back to the deployment's service). */
  careTeam: { name: string; phone: string | null; outOfHoursPhone: string | null; outOfHoursServiceName: string | null } | null;
  /** With no catheter in place: when the last one came out, and how its trial without catheter went. */
  removal: LastRemoval | null;
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
      lot: catheterEpisodes.lot,
      expiry: catheterEpisodes.expiry,
      attempts: catheterEpisodes.attempts,
      difficulties: catheterEpisodes.difficulties,
    })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)))
    .orderBy(desc(catheterEpisodes.insertedAt))
    .limit(1)
    .as("e");
  const checklist = tx
    .select({ drainage: dischargeChecklists.drainage })
    .from(dischargeChecklists)
    .where(eq(dischargeChecklists.patientId, patientId))
    .orderBy(desc(dischargeChecklists.createdAt))
    .limit(1)
    .as("c");
  // The lead team's numbers come from the one place (db/queries/contacts.ts), read alongside.
  const [[row], lead, removal] = await Promise.all([
    tx
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
        lot: episode.lot,
        expiry: episode.expiry,
        attempts: episode.attempts,
        difficulties: episode.difficulties,
      },
      drainage: checklist.drainage,
    })
    .from(patients)
    .leftJoinLateral(episode, sql`true`)
    .leftJoinLateral(checklist, sql`true`)
    .where(eq(patients.id, patientId)),
    getLeadTeamContact({ patientId }, tx),
    getLastRemoval({ patientId }, tx),
  ]);
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
          lot: e.lot ?? null,
          expiry: e.expiry ?? null,
          difficult: (e.attempts ?? 1) > 1 || Boolean(e.difficulties?.trim()),
          difficulties: e.difficulties?.trim() || null,
        }
      : null,
    drainage: row.drainage ?? null,
    allergies: { latex: row.latex, chlorhexidine: row.chlorhexidine, lidocaine: row.lidocaine },
    careTeam:
      lead && (lead.phone || lead.outOfHoursPhone)
        ? { name: lead.name, phone: lead.phone, outOfHoursPhone: lead.outOfHoursPhone, outOfHoursServiceName: lead.outOfHoursServiceName }
        : null,
    removal: e ? null : removal,
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
