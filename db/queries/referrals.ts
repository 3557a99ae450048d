import "server-only";
// Referrals between care-team organisations and the care team's own changes (add a team, change
// the lead, leave). Every write takes the caller's transaction, which holds the audit event.
import { aliasedTable, and, asc, desc, eq, ilike, inArray, lt, ne, or, sql } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import { auditEvents, careTeam, dischargeChecklists, organisations, patients, referrals, user, type Referral } from "@/db/schema";
import type { DischargeChecklistValues } from "@/lib/validations/referrals";

const teamKinds = ["hospital_ward", "community_team"] as const;

function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** The deployment's wards and community teams, searchable by name or hospital (the referral directory). */
export async function searchTeamDirectory({ q }: { q?: string }, tx: Executor = db) {
  const where = q
    ? and(inArray(organisations.kind, [...teamKinds]), or(ilike(organisations.name, likePattern(q)), ilike(organisations.parentName, likePattern(q))))
    : inArray(organisations.kind, [...teamKinds]);
  return tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind, parentName: organisations.parentName, phone: organisations.phone })
    .from(organisations)
    .where(where)
    .orderBy(asc(organisations.name))
    .limit(50);
}

export type CareTeamMember = { organisationId: string; name: string; kind: string; lead: boolean; phone: string | null };

/** The patient's care team (wards and community teams), the lead first. */
export async function listCareTeam({ patientId }: { patientId: string }, tx: Executor = db): Promise<CareTeamMember[]> {
  return tx
    .select({ organisationId: organisations.id, name: organisations.name, kind: organisations.kind, lead: careTeam.lead, phone: organisations.phone })
    .from(careTeam)
    .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
    .where(and(eq(careTeam.patientId, patientId), inArray(organisations.kind, [...teamKinds])))
    .orderBy(desc(careTeam.lead), asc(organisations.name));
}

export async function getTeamOrganisation({ id }: { id: string }, tx: Executor = db) {
  const [o] = await tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind, inboxEmail: organisations.inboxEmail, locale: organisations.locale })
    .from(organisations)
    .where(and(eq(organisations.id, id), inArray(organisations.kind, [...teamKinds])));
  return o ?? null;
}

/** Makes `organisationId` (already on the care team) the lead, and no other. */
export async function setLead({ patientId, organisationId }: { patientId: string; organisationId: string }, tx: Executor) {
  await tx.update(careTeam).set({ lead: false }).where(and(eq(careTeam.patientId, patientId), eq(careTeam.lead, true)));
  await tx.update(careTeam).set({ lead: true }).where(and(eq(careTeam.patientId, patientId), eq(careTeam.organisationId, organisationId)));
}

/** Adds an organisation to the care team; true when it was not on it already. */
export async function addToCareTeam({ patientId, organisationId }: { patientId: string; organisationId: string }, tx: Executor) {
  const rows = await tx.insert(careTeam).values({ patientId, organisationId }).onConflictDoNothing().returning({ id: careTeam.organisationId });
  return rows.length > 0;
}

/** Takes an organisation off the care team; the lead passes to the first remaining team when it leaves. */
export async function removeFromCareTeam({ patientId, organisationId }: { patientId: string; organisationId: string }, tx: Executor) {
  const [gone] = await tx
    .delete(careTeam)
    .where(and(eq(careTeam.patientId, patientId), eq(careTeam.organisationId, organisationId)))
    .returning({ lead: careTeam.lead });
  if (gone?.lead) {
    const [next] = await listCareTeam({ patientId }, tx);
    if (next) await setLead({ patientId, organisationId: next.organisationId }, tx);
  }
  return Boolean(gone);
}

export async function insertReferral(values: typeof referrals.$inferInsert, tx: Executor) {
  const [row] = await tx.insert(referrals).values(values).returning();
  return row;
}

/** The referral, locked for the answer (two answers at once: one waits, then sees it answered). */
export async function getReferralForUpdate({ id }: { id: string }, tx: Executor): Promise<Referral | null> {
  const [r] = await tx.select().from(referrals).where(eq(referrals.id, id)).for("update");
  return r ?? null;
}

export async function getReferral({ id }: { id: string }, tx: Executor = db): Promise<Referral | null> {
  const [r] = await tx.select().from(referrals).where(eq(referrals.id, id));
  return r ?? null;
}

export async function answerReferral(
  { id, status, userId, declineReason }: { id: string; status: "accepted" | "declined" | "withdrawn"; userId: string; declineReason?: string | null },
  tx: Executor,
) {
  await tx
    .update(referrals)
    .set({ status, answeredByUserId: userId, answeredAt: new Date(), declineReason: declineReason ?? null })
    .where(and(eq(referrals.id, id), eq(referrals.status, "pending")));
}

const fromOrg = aliasedTable(organisations, "from_org");
const toOrg = aliasedTable(organisations, "to_org");
const referrer = aliasedTable(user, "referrer");
const answerer = aliasedTable(user, "answerer");

const referralColumns = {
  id: referrals.id,
  patientId: referrals.patientId,
  status: referrals.status,
  handoverNote: referrals.handoverNote,
  referrerStays: referrals.referrerStays,
  declineReason: referrals.declineReason,
  createdAt: referrals.createdAt,
  answeredAt: referrals.answeredAt,
  remindedAt: referrals.remindedAt,
  reminders: referrals.reminders,
  fromOrganisationId: referrals.fromOrganisationId,
  fromName: fromOrg.name,
  toOrganisationId: referrals.toOrganisationId,
  toName: toOrg.name,
  referredByName: referrer.name,
  answeredByName: answerer.name,
  givenName: patients.givenName,
  familyName: patients.familyName,
  healthRecordNumber: patients.healthRecordNumber,
  dateOfBirth: patients.dateOfBirth,
};

function referralQuery(tx: Executor) {
  return tx
    .select(referralColumns)
    .from(referrals)
    .innerJoin(patients, eq(patients.id, referrals.patientId))
    .innerJoin(fromOrg, eq(fromOrg.id, referrals.fromOrganisationId))
    .innerJoin(toOrg, eq(toOrg.id, referrals.toOrganisationId))
    .leftJoin(referrer, eq(referrer.id, referrals.referredByUserId))
    .leftJoin(answerer, eq(answerer.id, referrals.answeredByUserId));
}

/** Every referral of a patient, newest first (the record's transfer-of-care timeline). */
export async function listPatientReferrals({ patientId }: { patientId: string }, tx: Executor = db) {
  return referralQuery(tx).where(eq(referrals.patientId, patientId)).orderBy(desc(referrals.createdAt));
}

/**
 * The caseload's referral lists for the viewer's organisations: referred to them and waiting;
 * sent by them and still waiting (flagged once older than the reminder time), or declined in
 * the last 14 days so the referrer sees the reason. Open records only.
 */
export async function listCaseloadReferrals({ organisationIds, hours }: { organisationIds: string[]; hours: number }, tx: Executor = db) {
  if (organisationIds.length === 0) return { incoming: [], outgoing: [] };
  const open = sql`${patients.closedAt} is null`;
  // Unanswered past the reminder time: flagged on the referrer's caseload.
  const overdue = sql<boolean>`${referrals.status} = 'pending' and ${referrals.createdAt} < now() - make_interval(hours => ${hours}::int)`;
  const [incoming, outgoing] = await readTogether(
    tx,
    () => referralQuery(tx)
      .where(and(inArray(referrals.toOrganisationId, organisationIds), eq(referrals.status, "pending"), open))
      .orderBy(asc(referrals.createdAt)),
    () => tx
      .select({ ...referralColumns, overdue })
      .from(referrals)
      .innerJoin(patients, eq(patients.id, referrals.patientId))
      .innerJoin(fromOrg, eq(fromOrg.id, referrals.fromOrganisationId))
      .innerJoin(toOrg, eq(toOrg.id, referrals.toOrganisationId))
      .leftJoin(referrer, eq(referrer.id, referrals.referredByUserId))
      .leftJoin(answerer, eq(answerer.id, referrals.answeredByUserId))
      .where(
        and(
          inArray(referrals.fromOrganisationId, organisationIds),
          or(eq(referrals.status, "pending"), and(eq(referrals.status, "declined"), sql`${referrals.answeredAt} > now() - interval '14 days'`)),
          open,
        ),
      )
      .orderBy(asc(referrals.createdAt)),
  );
  return { incoming, outgoing };
}

/** Pending referrals of open records unanswered (and not sent again) for `hours`. */
export async function listOverdueReferrals({ hours, now = new Date() }: { hours: number; now?: Date }, tx: Executor = db) {
  const cutoff = new Date(now.getTime() - hours * 3_600_000);
  return tx
    .select({ id: referrals.id, patientId: referrals.patientId, reminders: referrals.reminders })
    .from(referrals)
    .innerJoin(patients, eq(patients.id, referrals.patientId))
    .where(and(eq(referrals.status, "pending"), sql`${patients.closedAt} is null`, lt(sql`coalesce(${referrals.remindedAt}, ${referrals.createdAt})`, cutoff)));
}

/** Counts the referral as sent again; false when it was answered (or sent again) meanwhile. */
export async function markReminded({ id, reminders, now = new Date() }: { id: string; reminders: number; now?: Date }, tx: Executor) {
  const rows = await tx
    .update(referrals)
    .set({ remindedAt: now, reminders: reminders + 1 })
    .where(and(eq(referrals.id, id), eq(referrals.status, "pending"), eq(referrals.reminders, reminders)))
    .returning({ id: referrals.id });
  return rows.length > 0;
}

/** Whether the viewer belongs to an organisation other than `organisationId` on the care team. */
export async function otherTeamsRemain({ patientId, organisationId }: { patientId: string; organisationId: string }, tx: Executor = db) {
  const rows = await tx
    .select({ id: careTeam.organisationId })
    .from(careTeam)
    .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
    .where(and(eq(careTeam.patientId, patientId), ne(careTeam.organisationId, organisationId), inArray(organisations.kind, [...teamKinds])));
  return rows.length > 0;
}

export async function insertDischargeChecklist(
  { patientId, referralId, userId, userName, organisationId, values }: { patientId: string; referralId: string | null; userId: string; userName: string; organisationId: string | null; values: DischargeChecklistValues },
  tx: Executor,
) {
  const [row] = await tx
    .insert(dischargeChecklists)
    .values({
      patientId,
      referralId,
      recordedByUserId: userId,
      recordedByName: userName,
      organisationId,
      taught: values.taught,
      suppliesGiven: values.suppliesGiven,
      suppliesDays: values.suppliesGiven ? values.suppliesDays : null,
      drainage: values.drainage,
      plannedTwocOn: values.plannedTwocOn,
      firstVisitOn: values.firstVisitOn,
      portalActivationGiven: values.portalActivationGiven,
      notes: values.notes,
    })
    .returning({ id: dischargeChecklists.id });
  return row;
}

/** The latest discharge checklist on the record, or null. */
export async function getLatestDischargeChecklist({ patientId }: { patientId: string }, tx: Executor = db) {
  const [row] = await tx
    .select()
    .from(dischargeChecklists)
    .where(eq(dischargeChecklists.patientId, patientId))
    .orderBy(desc(dischargeChecklists.createdAt))
    .limit(1);
  return row ?? null;
}

export const TRANSFER_ACTIONS = [
  "referral.create",
  "referral.accept",
  "referral.decline",
  "referral.withdraw",
  "referral.remind",
  "care-team.add",
  "care-team.lead",
  "care-team.leave",
  "discharge-checklist.record",
] as const;
export type TransferAction = (typeof TRANSFER_ACTIONS)[number];

/** The record's transfer-of-care timeline: each referral step and care-team change, newest first, from the audit log. */
export async function listTransferTimeline({ patientId }: { patientId: string }, tx: Executor = db) {
  const rows = await tx
    .select({ id: auditEvents.id, at: auditEvents.at, action: auditEvents.action, reason: auditEvents.reason, actorName: user.name, organisationName: organisations.name })
    .from(auditEvents)
    .leftJoin(user, eq(user.id, auditEvents.actorUserId))
    .leftJoin(organisations, eq(organisations.id, auditEvents.organisationId))
    .where(and(eq(auditEvents.patientId, patientId), inArray(auditEvents.action, [...TRANSFER_ACTIONS])))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(200);
  return rows.map((r) => ({ ...r, action: r.action as TransferAction, at: r.at.toISOString() }));
}
