import "server-only";
// Passports: the rows (hashes only, never a plain token), the data the booklet prints, and the
// one-transaction reissue. Access checks happen before these are called.
import { and, desc, eq, isNull, max, sql } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import type { AllergyAnswers } from "@/lib/clinical";
import { getSettings } from "@/lib/config/settings";
import { getLeadTeamContact } from "./contacts";
import { getLatestDischargeChecklist } from "./referrals";
import {
  careTeam,
  catheterEpisodes,
  dischargeChecklists,
  episodeEvents,
  organisations,
  passports,
  patients,
  user,
  type Passport,
} from "@/db/schema";
import type { TwocOutcome } from "@/lib/clinical";
import type { TranslationReview } from "@/lib/validations/settings";

export type PassportSummary = {
  id: string;
  issuedAt: string;
  issuedByName: string | null;
  languages: string[];
  revokedAt: string | null;
};

export type PassportOverview = {
  current: (PassportSummary & { outOfDate: boolean }) | null;
  /** Every passport of the patient, newest first (the current one included). */
  history: PassportSummary[];
};

function toSummary(row: { id: string; issuedAt: Date; issuedByName: string | null; languages: string[]; revokedAt: Date | null }): PassportSummary {
  return {
    id: row.id,
    issuedAt: row.issuedAt.toISOString(),
    issuedByName: row.issuedByName,
    languages: row.languages,
    revokedAt: row.revokedAt ? row.revokedAt.toISOString() : null,
  };
}

/** The last change to anything the booklet prints (details, catheters, events, care team, discharge checklist). */
async function lastRecordChange({ patientId }: { patientId: string }, tx: Executor): Promise<Date | null> {
  const [p] = await tx.select({ at: patients.updatedAt }).from(patients).where(eq(patients.id, patientId));
  const [e] = await tx.select({ at: max(catheterEpisodes.updatedAt) }).from(catheterEpisodes).where(eq(catheterEpisodes.patientId, patientId));
  const [v] = await tx.select({ at: max(episodeEvents.updatedAt) }).from(episodeEvents).where(eq(episodeEvents.patientId, patientId));
  const [c] = await tx.select({ at: max(careTeam.updatedAt) }).from(careTeam).where(eq(careTeam.patientId, patientId));
  const [d] = await tx.select({ at: max(dischargeChecklists.createdAt) }).from(dischargeChecklists).where(eq(dischargeChecklists.patientId, patientId));
  const times = [p?.at, e?.at, v?.at, c?.at, d?.at].filter((d): d is Date => d instanceof Date);
  return times.length ? new Date(Math.max(...times.map((d) => d.getTime()))) : null;
}

/** What a passport summary reads (its issuer's name joined from user). */
const summaryColumns = {
  id: passports.id,
  issuedAt: passports.issuedAt,
  issuedByName: user.name,
  languages: passports.languages,
  revokedAt: passports.revokedAt,
};

export async function getPassportOverview({ patientId }: { patientId: string }, tx: Executor = db): Promise<PassportOverview> {
  const rows = await tx
    .select(summaryColumns)
    .from(passports)
    .leftJoin(user, eq(user.id, passports.issuedByUserId))
    .where(eq(passports.patientId, patientId))
    .orderBy(desc(passports.issuedAt), desc(passports.createdAt));
  const history = rows.map(toSummary);
  const currentRow = rows.find((r) => !r.revokedAt);
  if (!currentRow) return { current: null, history };
  const changed = await lastRecordChange({ patientId }, tx);
  return {
    current: { ...toSummary(currentRow), outOfDate: Boolean(changed && changed > currentRow.issuedAt) },
    history,
  };
}

/** The unrevoked passport of a patient, or null. */
export async function getCurrentPassport({ patientId }: { patientId: string }, tx: Executor = db): Promise<PassportSummary | null> {
  const [row] = await tx
    .select(summaryColumns)
    .from(passports)
    .leftJoin(user, eq(user.id, passports.issuedByUserId))
    .where(and(eq(passports.patientId, patientId), isNull(passports.revokedAt)));
  return row ? toSummary(row) : null;
}

/** The passport a token hash belongs to (revoked or not); for lib/passport only. */
export async function findPassportRowByTokenHash({ tokenHash }: { tokenHash: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ id: passports.id, patientId: passports.patientId, tokenHash: passports.tokenHash, revokedAt: passports.revokedAt, issuedAt: passports.issuedAt })
    .from(passports)
    .where(eq(passports.tokenHash, tokenHash));
  return row ?? null;
}

export async function findPassportRowByShortCodeHash({ shortCodeHash }: { shortCodeHash: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ id: passports.id, patientId: passports.patientId, shortCodeHash: passports.shortCodeHash, revokedAt: passports.revokedAt, issuedAt: passports.issuedAt })
    .from(passports)
    .where(eq(passports.shortCodeHash, shortCodeHash));
  return row ?? null;
}

/**
 * Reissue in one transaction: lock the patient row (two nurses pressing at once take turns),
 * revoke whatever passport is current, insert the new one. Returns the revoked ids.
 */
export async function replacePassport(
  {
    id,
    patientId,
    tokenHash,
    shortCodeHash,
    languages,
    issuedByUserId,
    issuedAt,
  }: { id: string; patientId: string; tokenHash: string; shortCodeHash: string; languages: string[]; issuedByUserId: string; issuedAt: Date },
  tx: Executor,
): Promise<{ passport: Passport; revokedIds: string[] }> {
  await tx.execute(sql`select 1 from ${patients} where ${patients.id} = ${patientId} for update`);
  const revoked = await tx
    .update(passports)
    .set({ revokedAt: issuedAt })
    .where(and(eq(passports.patientId, patientId), isNull(passports.revokedAt)))
    .returning({ id: passports.id });
  const [passport] = await tx
    .insert(passports)
    .values({ id, patientId, tokenHash, shortCodeHash, languages, issuedByUserId, issuedAt })
    .returning();
  return { passport, revokedIds: revoked.map((r) => r.id) };
}

// ------------------------------------------------------------------ what the booklet prints

export type BookletRecord = {
  patient: {
    givenName: string;
    familyName: string;
    dateOfBirth: string;
    healthRecordNumber: string;
    preferredLocale: string;
    allergies: AllergyAnswers & { other: string | null };
  };
  currentEpisode: (typeof catheterEpisodes.$inferSelect & { organisationName: string | null }) | null;
  episodes: { id: string; sizeCh: number; material: (typeof catheterEpisodes.$inferSelect)["material"]; lot: string | null }[];
  events: {
    episodeId: string;
    kind: (typeof episodeEvents.$inferSelect)["kind"];
    reason: (typeof episodeEvents.$inferSelect)["reason"];
    twocOutcome: TwocOutcome | null;
    occurredAt: Date;
    recordedByName: string;
    organisationName: string | null;
  }[];
  careTeams: { name: string; phone: string | null; outOfHoursPhone: string | null }[];
  gp: { name: string; phone: string | null; outOfHoursPhone: string | null } | null;
  checklist: Awaited<ReturnType<typeof getLatestDischargeChecklist>>;
  /** Null when an admin has not set it: the booklet is then refused, never printed without it. */
  settings: { emergencyNumber: string | null; outOfHoursServiceName: string | null; region: string | null; translationReviews: Partial<Record<string, TranslationReview>> };
};

export async function getBookletRecord({ patientId }: { patientId: string }, tx: Executor = db): Promise<BookletRecord | null> {
  const [p] = await tx.select().from(patients).where(eq(patients.id, patientId));
  if (!p) return null;
  const [current, episodes, events, teams, gpRows, deployment, checklist] = await readTogether(
    tx,
    () => tx
      .select({ episode: catheterEpisodes, organisationName: organisations.name })
      .from(catheterEpisodes)
      .leftJoin(organisations, eq(organisations.id, catheterEpisodes.organisationId))
      .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)))
      .orderBy(desc(catheterEpisodes.insertedAt))
      .limit(1),
    () => tx
      .select({ id: catheterEpisodes.id, sizeCh: catheterEpisodes.sizeCh, material: catheterEpisodes.material, lot: catheterEpisodes.lot })
      .from(catheterEpisodes)
      .where(eq(catheterEpisodes.patientId, patientId)),
    () => tx
      .select({
        episodeId: episodeEvents.episodeId,
        kind: episodeEvents.kind,
        reason: episodeEvents.reason,
        twocOutcome: episodeEvents.twocOutcome,
        occurredAt: episodeEvents.occurredAt,
        recordedByName: episodeEvents.recordedByName,
        organisationName: organisations.name,
      })
      .from(episodeEvents)
      .leftJoin(organisations, eq(organisations.id, episodeEvents.organisationId))
      .where(eq(episodeEvents.patientId, patientId))
      .orderBy(desc(episodeEvents.occurredAt), desc(episodeEvents.createdAt)),
    // The lead team alone, with its out-of-hours number or the deployment's service (one place: contacts.ts).
    () => getLeadTeamContact({ patientId }, tx),
    () => p.gpPracticeId
      ? tx
          .select({ name: organisations.name, phone: organisations.phone, outOfHoursPhone: organisations.outOfHoursPhone })
          .from(organisations)
          .where(eq(organisations.id, p.gpPracticeId))
      : Promise.resolve([]),
    () => getSettings(tx),
    () => getLatestDischargeChecklist({ patientId }, tx),
  );
  return {
    patient: {
      givenName: p.givenName,
      familyName: p.familyName,
      dateOfBirth: p.dateOfBirth,
      healthRecordNumber: p.healthRecordNumber,
      preferredLocale: p.preferredLocale,
      allergies: { latex: p.allergyLatex, chlorhexidine: p.allergyChlorhexidine, lidocaine: p.allergyLidocaine, other: p.allergyOther ?? null },
    },
    currentEpisode: current[0] ? { ...current[0].episode, organisationName: current[0].organisationName } : null,
    episodes,
    events: events.map((e) => ({ ...e, twocOutcome: e.twocOutcome ?? null })),
    careTeams: teams ? [{ name: teams.name, phone: teams.phone, outOfHoursPhone: teams.outOfHoursPhone }] : [],
    gp: gpRows[0] ?? null,
    checklist,
    // The service's name goes beside its number only: a team's own out-of-hours line is the team's.
    settings: {
      emergencyNumber: deployment.emergencyNumber,
      outOfHoursServiceName: teams?.outOfHoursIsService ? deployment.outOfHoursServiceName : null,
      region: deployment.region,
      translationReviews: deployment.translationReviews,
    },
  };
}
