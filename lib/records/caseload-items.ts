import "server-only";
// Closing the loop on alerts. An urgent or emergency check-in and an alerting NEWS2 become an item
// on the alert team's caseload (lib/records/alert-team.ts) in the transaction that stores them;
// a nurse of that team acknowledges it with what was done, and the patient and carer see when.
// An item nobody acknowledged within the configured working time is sent to the team again
// through the outbox (once) and shows in red. A urine sample sent on a visit leaves a "result to
// chase" item until someone marks it done.
import { db, type Executor } from "@/db";
import { closeCaseloadItem, getCaseloadItem, insertCaseloadItem, listItemsDueForReminder, listOpenItems, markItemResent, type OpenItemRow } from "@/db/queries/caseload-items";
import type { AlertReporter, CaseloadItem } from "@/db/schema";
import type { Viewer } from "@/lib/auth/session";
import { getAcknowledgePlan } from "@/lib/config/settings";
import { queueCareTeamAlert, type CareTeamAlertKind } from "@/lib/email/care-team-alert";
import { queueCarerAlerts } from "@/lib/email/carer-mail";
import { AppError } from "@/lib/http/errors";
import { addWorkingMinutes } from "@/lib/shared/working-hours";
import type { AcknowledgeInput } from "@/lib/validations/caseload-item";
import { alertTeams, inAlertTeam } from "./alert-team";
import { audit } from "./audit";
import { writeRecord } from "./record-state";

export type AlertItemInput = {
  patientId: string;
  kind: Exclude<CareTeamAlertKind, "twoc-overdue">;
  level: string;
  summary: string;
  reporter: AlertReporter;
  notes?: string | null;
  checkInId?: string;
  observationId?: string;
  eventId?: string;
  /** For NEWS2: the total, for the e-mail. */
  score?: number;
  /** Who answered a check-in: a carer who answered is not also e-mailed about it. */
  reporterUserId?: string | null;
  now?: Date;
};

/**
 * The alert e-mail to the alert teams and the item to acknowledge, in the caller's transaction.
 * Returns the queued messages (one per team).
 */
export async function raiseAlert(tx: Executor, input: AlertItemInput) {
  const now = input.now ?? new Date();
  const queued = await queueCareTeamAlert(tx, {
    patientId: input.patientId,
    kind: input.kind,
    level: input.level,
    summary: input.summary,
    sourceId: (input.checkInId ?? input.observationId)!,
    score: input.score,
    reporter: input.reporter,
    notes: input.notes,
  });
  // The patient's carers who chose to be told hear of an urgent or emergency check-in too.
  if (input.kind === "check-in" && input.checkInId && (input.level === "urgent" || input.level === "emergency")) {
    await queueCarerAlerts(tx, { patientId: input.patientId, checkInId: input.checkInId, level: input.level, reporterUserId: input.reporterUserId });
  }
  if (queued.length === 0) return queued;
  const plan = await getAcknowledgePlan(tx);
  await insertCaseloadItem(
    {
      values: {
        patientId: input.patientId,
        kind: input.kind,
        level: input.level,
        checkInId: input.checkInId ?? null,
        observationId: input.observationId ?? null,
        eventId: input.eventId ?? null,
        summary: input.summary,
        reporter: input.reporter,
        reporterNotes: input.notes ?? null,
        dueAt: addWorkingMinutes(now, plan.minutes, plan.hours),
        createdAt: now,
      },
    },
    tx,
  );
  return queued;
}

/** A urine sample sent on a visit: its result stays on the caseload until marked done. */
export async function raiseSampleToChase(tx: Executor, input: { patientId: string; eventId: string; summary: string; reporter: AlertReporter }) {
  await insertCaseloadItem(
    { values: { patientId: input.patientId, kind: "sample-result", eventId: input.eventId, summary: input.summary, reporter: input.reporter } },
    tx,
  );
}

export type CaseloadItemView = {
  id: string;
  patientId: string;
  patientName: string;
  healthRecordNumber: string;
  kind: CaseloadItem["kind"];
  level: string | null;
  summary: string;
  reporter: AlertReporter | null;
  reporterNotes: string | null;
  createdAt: string;
  dueAt: string | null;
  /** Past its time (or already sent again): shown in red. */
  overdue: boolean;
  resentAt: string | null;
};

function toView(r: OpenItemRow, now: Date): CaseloadItemView {
  return {
    id: r.id,
    patientId: r.patientId,
    patientName: `${r.givenName} ${r.familyName}`,
    healthRecordNumber: r.healthRecordNumber,
    kind: r.kind,
    level: r.level,
    summary: r.summary,
    reporter: r.reporter ?? null,
    reporterNotes: r.reporterNotes,
    createdAt: r.createdAt.toISOString(),
    dueAt: r.dueAt ? r.dueAt.toISOString() : null,
    overdue: Boolean(r.resentAt) || (r.dueAt !== null && r.dueAt.getTime() <= now.getTime()),
    resentAt: r.resentAt ? r.resentAt.toISOString() : null,
  };
}

/** Open items for the viewer's caseload: only those of patients whose alert team they are in. */
export async function openItemsFor(viewer: Viewer, now = new Date()): Promise<CaseloadItemView[]> {
  const rows = await listOpenItems({ organisationIds: viewer.organisationIds });
  const mine = new Map<string, boolean>();
  const out: CaseloadItemView[] = [];
  for (const r of rows) {
    if (!mine.has(r.patientId)) mine.set(r.patientId, await inAlertTeam({ patientId: r.patientId, organisationIds: viewer.organisationIds }));
    if (mine.get(r.patientId)) out.push(toView(r, now));
  }
  return out;
}

/**
 * A nurse of the alert team acknowledges an alert with what was done, or marks a sample's result
 * chased. Access (care team) is settled by the route before the body is read; here the record
 * must be open, the item the patient's and still open, and the viewer in its alert team.
 */
export async function closeItem({ viewer, patientId, itemId, input, request }: { viewer: Viewer; patientId: string; itemId: string; input: AcknowledgeInput; request: Request }) {
  return writeRecord(patientId, async (tx) => {
    if (!(await inAlertTeam({ patientId, organisationIds: viewer.organisationIds }, tx))) {
      throw new AppError("forbidden", "Only the team the alert went to can acknowledge it.");
    }
    const item = await getCaseloadItem({ patientId, itemId }, tx);
    if (!item) throw new AppError("not_found");
    if (item.closedAt) throw new AppError("conflict", "This was acknowledged already.");
    if (item.kind !== "sample-result" && !input.action) {
      throw new AppError("validation_failed", undefined, { fields: { action: ["choose_one"] } });
    }
    const closed = await closeCaseloadItem(
      {
        itemId,
        values: { closedAt: new Date(), closedByUserId: viewer.userId, closedByName: viewer.name, action: input.action ?? null, note: input.note ?? null },
      },
      tx,
    );
    if (!closed) throw new AppError("conflict", "This was acknowledged already.");
    await audit(
      { action: "caseload-item.acknowledge", actor: viewer, patientId, via: "care_team", request, details: { itemId, kind: item.kind, action: input.action ?? null } },
      tx,
    );
    return { id: closed.id, closedAt: closed.closedAt!.toISOString(), closedByName: closed.closedByName, action: closed.action };
  });
}

/**
 * Sends each alert nobody acknowledged in time to its teams again, once, through the outbox
 * (pg-boss runs it every few minutes). Each item in its own transaction, locked, so two workers
 * send it once between them.
 */
export async function sendAcknowledgeReminders({ now = new Date(), log = () => {} }: { now?: Date; log?: (m: string) => void } = {}) {
  const due = await listItemsDueForReminder({ now });
  let sent = 0;
  for (const item of due) {
    if (item.kind === "sample-result") continue;
    await db.transaction(async (tx) => {
      const locked = await getCaseloadItem({ patientId: item.patientId, itemId: item.id }, tx);
      if (!locked || locked.closedAt || locked.resentAt) return;
      const teams = await alertTeams({ patientId: item.patientId }, tx);
      const queued = await queueCareTeamAlert(tx, {
        patientId: item.patientId,
        kind: item.kind as CareTeamAlertKind,
        level: item.level ?? "",
        summary: item.summary,
        sourceId: (item.checkInId ?? item.observationId)!,
        reporter: item.reporter ?? undefined,
        notes: item.reporterNotes,
        reminderOf: item.createdAt,
      });
      if (!(await markItemResent({ itemId: item.id, at: now }, tx))) return;
      await audit(
        { action: "caseload-item.reminder", patientId: item.patientId, via: "system", details: { itemId: item.id, teams: teams.map((t) => t.id), messages: queued.map((m) => m.id) } },
        tx,
      );
      sent++;
    });
  }
  if (sent) log(`acknowledgement reminders: ${sent} sent again`);
  return { sent };
}
