import "server-only";
// The passport's device card: what a stranger holding the QR may see, and nothing that names the
// patient (no name, date of birth, address or record number).
import { and, desc, eq, isNull } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, catheterEpisodes, organisations, passports, patients, visitAccess } from "@/db/schema";
import { hashesEqual, hashShortCode, hashToken, isWellFormedShortCode, isWellFormedToken } from "@/lib/qr/passport-token";

export type DeviceCard = {
  patientLocale: string;
  device: {
    route: string;
    catheterType: string;
    material: string;
    lengthCategory: string;
    sizeCh: number;
    balloonMl: number;
    insertedAt: string;
    plannedChangeOn: string;
  } | null;
  allergies: { latex: boolean; chlorhexidine: boolean; lidocaine: boolean };
  careTeamPhone: string | null;
};

/** The current (unrevoked) passport for a token, or null for unknown and revoked alike. */
export async function findCurrentPassportByToken({ token }: { token: string }, tx: Executor = db) {
  if (!isWellFormedToken(token)) return null;
  const hash = hashToken(token);
  const [row] = await tx
    .select({ id: passports.id, patientId: passports.patientId, tokenHash: passports.tokenHash })
    .from(passports)
    .where(and(eq(passports.tokenHash, hash), isNull(passports.revokedAt)))
    .limit(1);
  if (!row || !hashesEqual(row.tokenHash, hash)) return null;
  return { id: row.id, patientId: row.patientId };
}

/** The current passport for a typed short code, or null. */
export async function findCurrentPassportByShortCode({ code }: { code: string }, tx: Executor = db) {
  if (!isWellFormedShortCode(code)) return null;
  const hash = hashShortCode(code);
  const [row] = await tx
    .select({ id: passports.id, patientId: passports.patientId, shortCodeHash: passports.shortCodeHash })
    .from(passports)
    .where(and(eq(passports.shortCodeHash, hash), isNull(passports.revokedAt)))
    .limit(1);
  if (!row || !hashesEqual(row.shortCodeHash, hash)) return null;
  return { id: row.id, patientId: row.patientId };
}

export async function getDeviceCard({ patientId }: { patientId: string }, tx: Executor = db): Promise<DeviceCard> {
  const [p] = await tx
    .select({
      locale: patients.preferredLocale,
      latex: patients.allergyLatex,
      chlorhexidine: patients.allergyChlorhexidine,
      lidocaine: patients.allergyLidocaine,
    })
    .from(patients)
    .where(eq(patients.id, patientId));
  const [e] = await tx
    .select({
      route: catheterEpisodes.route,
      catheterType: catheterEpisodes.catheterType,
      material: catheterEpisodes.material,
      lengthCategory: catheterEpisodes.lengthCategory,
      sizeCh: catheterEpisodes.sizeCh,
      balloonMl: catheterEpisodes.balloonMl,
      insertedAt: catheterEpisodes.insertedAt,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
    })
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)))
    .orderBy(desc(catheterEpisodes.insertedAt))
    .limit(1);
  const [team] = await tx
    .select({ phone: organisations.phone })
    .from(careTeam)
    .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
    .where(eq(careTeam.patientId, patientId))
    .orderBy(organisations.name)
    .limit(1);
  return {
    patientLocale: p?.locale ?? "en",
    device: e ? { ...e, insertedAt: e.insertedAt.toISOString() } : null,
    allergies: { latex: !!p?.latex, chlorhexidine: !!p?.chlorhexidine, lidocaine: !!p?.lidocaine },
    careTeamPhone: team?.phone ?? null,
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
