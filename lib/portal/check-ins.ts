import "server-only";
// Saving a check-in: the server scores the answers again with lib/clinical (the phone's level is
// never trusted), stores the rule ids, keeps the caseload's latest level, and for urgent or
// emergency results alerts the care team, all in one transaction. The idempotency key makes a
// resend (an offline phone, a double tap) return the first result without a second row.
import { getLastRemoval } from "@/db/queries/episodes";
import { getActiveRoute, getCheckInByKey, insertCheckIn, setLatestCheckIn, toCheckInDto, type CheckInDto } from "@/db/queries/check-ins";
import type { Executor } from "@/db";
import type { PatientAccessVia } from "@/db/queries/access";
import { TRIAGE_RULES, type TriageLevel } from "@/lib/clinical";
import { scoreAnswers, type SubmittedAnswers } from "@/lib/shared/check-in-flow";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { raiseAlert } from "@/lib/records/caseload-items";
import type { Viewer } from "@/lib/auth/session";
import { AppError } from "@/lib/http/errors";

export type SubmitResult = { created: boolean; checkIn: CheckInDto; reasons: { ruleId: string; key: string; text: string }[] };

export async function submitCheckIn({
  viewer,
  via,
  patientId,
  answers,
  idempotencyKey,
  answeredAt,
  request,
}: {
  viewer: Viewer;
  via: PatientAccessVia;
  patientId: string;
  answers: SubmittedAnswers;
  idempotencyKey: string;
  answeredAt?: string;
  request: Request;
}): Promise<SubmitResult> {
  const now = Date.now();
  // Bounded by the schema (lib/validations/entry-time.ts): within the last 7 days, not ahead.
  const answered: Date | null = answeredAt ? new Date(answeredAt) : null;

  const route = await getActiveRoute({ patientId });
  // No catheter in place and one has come out: the check-in after the catheter (the record decides, not the phone).
  const afterCatheter = route === null && (await getLastRemoval({ patientId })) !== null;
  const scored = scoreAnswers(answers, route, afterCatheter);
  if (!scored) {
    throw new AppError("validation_failed", "Please answer every question.", {
      fields: { answers: ["The check-in is not finished: how the catheter drains and pain are needed."] },
    });
  }
  const { result } = scored;

  return writeRecord(patientId, async (tx) => {
    const row = await insertCheckIn(
      { patientId, reportedByUserId: viewer.userId, answers, level: result.level, ruleIds: result.ruleIds, idempotencyKey, answeredAt: answered },
      tx,
    );
    if (!row) {
      const first = await getCheckInByKey({ idempotencyKey }, tx);
      // A key already used for another patient is not this check-in.
      if (!first || first.patientId !== patientId) throw new AppError("conflict", "This check-in key has been used already.");
      return { created: false, checkIn: toCheckInDto(first), reasons: reasonsOf(first.ruleIds) };
    }
    await setLatestCheckIn({ patientId, level: result.level, at: answered ?? row.createdAt }, tx);
    await audit(
      {
        action: "check-in.submit",
        actor: viewer,
        patientId,
        via,
        request,
        details: { checkInId: row.id, level: result.level, ruleIds: result.ruleIds, delayed: answered !== null && now - answered.getTime() > 5 * 60_000 },
      },
      tx,
    );
    if (result.level === "urgent" || result.level === "emergency") {
      await alertCareTeam(tx, {
        patientId,
        level: result.level,
        summary: result.reasons.map((r) => r.text).join(" "),
        sourceId: row.id,
        actor: viewer,
        request,
      });
    }
    return { created: true, checkIn: toCheckInDto(row), reasons: result.reasons.map(({ ruleId, key, text }) => ({ ruleId, key, text })) };
  });
}

const TRIAGE_RULE_BY_ID = new Map(TRIAGE_RULES.map((r) => [r.id, r]));

function reasonsOf(ruleIds: string[]) {
  return ruleIds.map((id) => {
    const rule = TRIAGE_RULE_BY_ID.get(id);
    return { ruleId: id, key: rule?.reason.key ?? id, text: rule?.reason.text ?? id };
  });
}

/**
 * An urgent or emergency check-in e-mails every care-team organisation's inbox through the outbox,
 * in the same transaction as the check-in, so the alert exists exactly when the check-in does.
 * The caseload shows the level too (patients.latest_check_in_level), set in the same transaction.
 */
export async function alertCareTeam(
  tx: Executor,
  {
    patientId,
    level,
    summary,
    sourceId,
    actor,
    request,
  }: { patientId: string; level: Extract<TriageLevel, "urgent" | "emergency">; summary: string; sourceId: string; actor: Viewer; request: Request },
) {
  // The alert e-mail and the item to acknowledge on the team's caseload, together.
  const reporter = actor.role === "carer" ? { kind: "carer" as const, name: actor.name } : { kind: "patient" as const };
  const queued = await raiseAlert(tx, { patientId, kind: "check-in", level, summary, reporter, checkInId: sourceId, reporterUserId: actor.userId });
  await audit(
    { action: "check-in.alert", actor, patientId, via: "system", request, details: { level, sourceId, messages: queued.map((m) => m.id) } },
    tx,
  );
}
