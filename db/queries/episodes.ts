import "server-only";
// Reads and writes of catheter episodes and their events. Callers pass the transaction they
// opened with the access check, so a record and its audit event commit or fail together.
import { and, desc, eq, inArray, isNull, sql, type SQL } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import type { AllergyAnswers, TwocOutcome } from "@/lib/clinical";
import {
  careTeam,
  catheterEpisodes,
  episodeEvents,
  patients,
  type CatheterEpisode,
  type NewCatheterEpisode,
  type NewEpisodeEvent,
} from "@/db/schema";
import type { Sex } from "@/lib/clinical";

export type PatientForRecording = {
  id: string;
  name: string;
  sex: Sex;
  dateOfBirth: string;
  allergies: AllergyAnswers & { other: string | null };
  closed: boolean;
};

/** What a form shows and prefills from: the catheter spec, never the lot or expiry of the last one. */
export type EpisodeDto = {
  id: string;
  patientId: string;
  previousEpisodeId: string | null;
  route: CatheterEpisode["route"];
  catheterType: CatheterEpisode["catheterType"];
  material: CatheterEpisode["material"];
  lengthCategory: CatheterEpisode["lengthCategory"];
  sizeCh: number;
  balloonMl: number;
  makerBalloonMl: number | null;
  maker: string | null;
  productName: string | null;
  lot: string | null;
  expiry: string | null;
  gtin: string | null;
  serial: string | null;
  udi: string | null;
  indication: string;
  insertedAt: string;
  insertedByName: string;
  gelKind: CatheterEpisode["gelKind"];
  gelVolumeMl: number | null;
  residualUrineMl: number | null;
  urineDescription: string | null;
  specimenTaken: boolean;
  attempts: number;
  difficulties: string | null;
  patientReaction: string | null;
  largerSizeReason: string | null;
  maxDwellDays: number | null;
  reviewIntervalDays: number | null;
  plannedChangeOn: string;
  reviewDueOn: string;
  findings: unknown[];
  overrides: { code: string; reason: string }[];
  awaitingTwoc: boolean;
  removedAt: string | null;
  removalReason: string | null;
};

export function toEpisodeDto(e: CatheterEpisode): EpisodeDto {
  return {
    id: e.id,
    patientId: e.patientId,
    previousEpisodeId: e.previousEpisodeId,
    route: e.route,
    catheterType: e.catheterType,
    material: e.material,
    lengthCategory: e.lengthCategory,
    sizeCh: e.sizeCh,
    balloonMl: e.balloonMl,
    makerBalloonMl: e.makerBalloonMl,
    maker: e.maker,
    productName: e.productName,
    lot: e.lot,
    expiry: e.expiry,
    gtin: e.gtin,
    serial: e.serial,
    udi: e.udi,
    indication: e.indication,
    insertedAt: e.insertedAt.toISOString(),
    insertedByName: e.insertedByName,
    gelKind: e.gelKind,
    gelVolumeMl: e.gelVolumeMl,
    residualUrineMl: e.residualUrineMl,
    urineDescription: e.urineDescription,
    specimenTaken: e.specimenTaken,
    attempts: e.attempts,
    difficulties: e.difficulties,
    patientReaction: e.patientReaction,
    largerSizeReason: e.largerSizeReason,
    maxDwellDays: e.maxDwellDays,
    reviewIntervalDays: e.reviewIntervalDays,
    plannedChangeOn: e.plannedChangeOn,
    reviewDueOn: e.reviewDueOn,
    findings: e.findings,
    overrides: e.overrides,
    awaitingTwoc: e.awaitingTwoc,
    removedAt: e.removedAt ? e.removedAt.toISOString() : null,
    removalReason: e.removalReason,
  };
}

/**
 * The patient facts the device checks need. With `lock`, the row is locked for the rest of
 * the transaction so two nurses recording at once are taken one after the other.
 */
export async function getPatientForRecording(
  { patientId, lock = false }: { patientId: string; lock?: boolean },
  tx: Executor = db,
): Promise<PatientForRecording | null> {
  const q = tx
    .select({
      id: patients.id,
      givenName: patients.givenName,
      familyName: patients.familyName,
      sex: patients.sex,
      dateOfBirth: patients.dateOfBirth,
      allergyLatex: patients.allergyLatex,
      allergyChlorhexidine: patients.allergyChlorhexidine,
      allergyLidocaine: patients.allergyLidocaine,
      allergyOther: patients.allergyOther,
      closedAt: patients.closedAt,
    })
    .from(patients)
    .where(eq(patients.id, patientId));
  const [row] = lock ? await q.for("update") : await q;
  if (!row) return null;
  return {
    id: row.id,
    name: `${row.givenName} ${row.familyName}`,
    sex: row.sex,
    dateOfBirth: row.dateOfBirth,
    allergies: {
      latex: row.allergyLatex,
      chlorhexidine: row.allergyChlorhexidine,
      lidocaine: row.allergyLidocaine,
      other: row.allergyOther,
    },
    closed: row.closedAt !== null,
  };
}

/** The catheter in place, if any. */
export async function getActiveEpisode({ patientId }: { patientId: string }, tx: Executor = db) {
  const [row] = await tx
    .select()
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)))
    .limit(1);
  return row ?? null;
}

/** The most recent catheter, in place or removed. */
export async function getLatestEpisode({ patientId }: { patientId: string }, tx: Executor = db) {
  const [row] = await tx
    .select()
    .from(catheterEpisodes)
    .where(eq(catheterEpisodes.patientId, patientId))
    .orderBy(desc(catheterEpisodes.insertedAt))
    .limit(1);
  return row ?? null;
}

/** Past catheters with how each ended, oldest first (for the blockage pattern). */
export async function listEpisodeEndings({ patientId }: { patientId: string }, tx: Executor = db) {
  return tx
    .select({ insertedAt: catheterEpisodes.insertedAt, removedAt: catheterEpisodes.removedAt, removalReason: catheterEpisodes.removalReason })
    .from(catheterEpisodes)
    .where(eq(catheterEpisodes.patientId, patientId))
    .orderBy(catheterEpisodes.insertedAt);
}

/** The viewer's organisation that cares for the patient (for the record), else their first one. */
export async function organisationForRecord(
  { patientId, organisationIds }: { patientId: string; organisationIds: string[] },
  tx: Executor = db,
): Promise<string | null> {
  if (organisationIds.length === 0) return null;
  const [row] = await tx
    .select({ id: careTeam.organisationId })
    .from(careTeam)
    .where(and(eq(careTeam.patientId, patientId), inArray(careTeam.organisationId, organisationIds)))
    .limit(1);
  return row?.id ?? organisationIds[0];
}

export async function insertEpisode({ values }: { values: NewCatheterEpisode }, tx: Executor) {
  const [row] = await tx.insert(catheterEpisodes).values(values).returning();
  return row;
}

export async function endEpisode(
  { episodeId, removedAt, removalReason, awaitingTwoc }: { episodeId: string; removedAt: Date; removalReason: string; awaitingTwoc: boolean },
  tx: Executor,
) {
  const [row] = await tx
    .update(catheterEpisodes)
    .set({ removedAt, removalReason, awaitingTwoc })
    .where(and(eq(catheterEpisodes.id, episodeId), isNull(catheterEpisodes.removedAt)))
    .returning();
  return row ?? null;
}

export async function closeTrialWithoutCatheter({ episodeId }: { episodeId: string }, tx: Executor) {
  await tx.update(catheterEpisodes).set({ awaitingTwoc: false }).where(eq(catheterEpisodes.id, episodeId));
}

/** The trial planned for a catheter in place (day and medicine note); a null day clears the plan. */
export async function setTwocPlan({ episodeId, plannedOn, medicineNote }: { episodeId: string; plannedOn: string | null; medicineNote: string | null }, tx: Executor) {
  await tx
    .update(catheterEpisodes)
    .set({ twocPlannedOn: plannedOn, twocMedicineNote: plannedOn ? medicineNote : null, awaitingTwoc: plannedOn !== null })
    .where(eq(catheterEpisodes.id, episodeId));
}

/**
 * Discharge from the catheter caseload after a passed trial (the follow-up review day), or back
 * on it (both null) when a catheter goes in again.
 */
export async function setCatheterDischarge(
  { patientId, dischargedAt, followUpReviewOn }: { patientId: string; dischargedAt: Date | null; followUpReviewOn: string | null },
  tx: Executor,
) {
  await tx.update(patients).set({ catheterDischargedAt: dischargedAt, followUpReviewOn }).where(eq(patients.id, patientId));
}

/** The discharged patient's follow-up review, where one is still to come: its day, or null. */
export async function getFollowUp({ patientId }: { patientId: string }, tx: Executor) {
  const [row] = await tx
    .select({ dischargedAt: patients.catheterDischargedAt, reviewOn: patients.followUpReviewOn })
    .from(patients)
    .where(eq(patients.id, patientId))
    .for("update");
  return row ?? null;
}

export async function insertEpisodeEvent({ values }: { values: NewEpisodeEvent }, tx: Executor) {
  const [row] = await tx.insert(episodeEvents).values(values).returning({ id: episodeEvents.id });
  return row.id;
}

/** Everything a recording form needs to open: the patient, the catheter in place, the last one, and how past ones ended. */
export async function getRecordingContext({ patientId }: { patientId: string }, tx: Executor = db) {
  const [patient, active, latest, endings] = await readTogether(
    tx,
    () => getPatientForRecording({ patientId }, tx),
    () => getActiveEpisode({ patientId }, tx),
    () => getLatestEpisode({ patientId }, tx),
    () => listEpisodeEndings({ patientId }, tx),
  );
  return {
    patient,
    active: active ? toEpisodeDto(active) : null,
    latest: latest ? toEpisodeDto(latest) : null,
    endings: endings.map((e) => ({ insertedAt: e.insertedAt, removedAt: e.removedAt, removalReason: e.removalReason })),
  };
}

/**
 * Trials without catheter still under way whose window closed by `due` (removed at or before it)
 * and whose lead team has not been told yet (no alert from that episode in the outbox), in open
 * records. Two workers at once queue the same idempotency key, so the team is told once.
 */
export async function listOverdueTrials({ removedBy }: { removedBy: Date }, tx: Executor = db) {
  const result = await tx.execute<{ id: string; patient_id: string; removed_at: Date | string }>(sql`
    select e.id, e.patient_id, e.removed_at
    from catheter_episodes e
    join patients p on p.id = e.patient_id and p.closed_at is null
    where e.awaiting_twoc and e.removed_at is not null and e.removed_at <= ${removedBy.toISOString()}::timestamptz
      and not exists (select 1 from outbound_messages m where m.kind = 'care-team-alert' and m.source_id = e.id::text)
    order by e.removed_at
    limit 200`);
  return result.rows.map((r) => ({ episodeId: r.id, patientId: r.patient_id, removedAt: new Date(r.removed_at) }));
}

export type LastRemoval = { removedAt: string; trial: TwocOutcome | "under-way" | null };

type LastRemovalRow = { removed_at: string | Date | null; awaiting_twoc: boolean | null; twoc_outcome: TwocOutcome | null };

/**
 * The patient's last catheter (in place or not) with its removal time and its trial's latest
 * outcome: one SQL fragment, also read inside the device card's single statement.
 */
export function lastRemovalQuery(patientId: SQL) {
  return sql`select l.removed_at as last_removed_at, l.awaiting_twoc as last_awaiting_twoc,
      (select ev.twoc_outcome from episode_events ev where ev.episode_id = l.id and ev.kind = 'twoc_outcome' order by ev.occurred_at desc limit 1) as last_twoc_outcome
    from catheter_episodes l where l.patient_id = ${patientId} order by l.inserted_at desc limit 1`;
}

/** The removal from a row of lastRemovalQuery; null when the last catheter is still in (or none). */
export function toLastRemoval(row: LastRemovalRow | undefined): LastRemoval | null {
  if (!row?.removed_at) return null;
  return { removedAt: new Date(row.removed_at).toISOString(), trial: row.awaiting_twoc ? "under-way" : (row.twoc_outcome ?? null) };
}

/** With no catheter in place, the last one's removal and its trial's outcome (device card, portal). */
export async function getLastRemoval({ patientId }: { patientId: string }, tx: Executor = db): Promise<LastRemoval | null> {
  const result = await tx.execute<{ last_removed_at: string | null; last_awaiting_twoc: boolean | null; last_twoc_outcome: TwocOutcome | null }>(lastRemovalQuery(sql`${patientId}::uuid`));
  const row = result.rows[0];
  return row ? toLastRemoval({ removed_at: row.last_removed_at, awaiting_twoc: row.last_awaiting_twoc, twoc_outcome: row.last_twoc_outcome }) : null;
}
