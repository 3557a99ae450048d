import "server-only";
// Recording an insertion, a change, a removal and a TWOC outcome. Each runs in one transaction:
// access check + audit (openPatientRecord), the device checks recomputed here whatever the
// browser showed, the episode and its event. Any error rolls everything back.
import { db, type Transaction } from "@/db";
import { queueGpSummary } from "@/lib/email/gp-summary";
import {
  closeTrialWithoutCatheter,
  endEpisode,
  getActiveEpisode,
  getFollowUp,
  getLatestEpisode,
  getPatientForRecording,
  insertEpisode,
  insertEpisodeEvent,
  organisationForRecord,
  setCatheterDischarge,
  setTwocPlan,
  toEpisodeDto,
  type EpisodeDto,
  type PatientForRecording,
} from "@/db/queries/episodes";
import type { CatheterEpisode, NewCatheterEpisode, NewEpisodeEvent } from "@/db/schema";
import type { Viewer } from "@/lib/auth/session";
import { planDates, type Finding, type PlanDefaults } from "@/lib/clinical";
import { getPlanDefaults } from "@/lib/config/settings";
import { reconcileOverrides, runDeviceCheck } from "@/lib/shared/episode-checks";
import { AppError } from "@/lib/http/errors";
import { openPatientRecord } from "@/lib/records/patient-record";
import { assertRecordOpen } from "@/lib/records/record-state";
import type { ChangeInput, DeviceCheckInput, FollowUpReviewInput, InsertionInput, RemovalInput, TwocInput, TwocPlanInput } from "@/lib/validations/episode";
import { dayIn, deploymentTimeZone } from "@/lib/shared/time-zone";

type Ctx = { viewer: Viewer; patientId: string; request: Request };

export type RecordedEpisode = {
  episode: EpisodeDto;
  eventId: string;
  findings: Finding[];
};

async function openForWrite(ctx: Ctx, action: string, tx: Transaction): Promise<PatientForRecording> {
  await openPatientRecord({ viewer: ctx.viewer, patientId: ctx.patientId, action, request: ctx.request }, tx);
  await assertRecordOpen(tx, ctx.patientId);
  const patient = await getPatientForRecording({ patientId: ctx.patientId, lock: true }, tx);
  if (!patient) throw new AppError("not_found");
  return patient;
}

/** An event of the record by the viewer, for their organisation on it (looked up unless given). */
async function recordEvent(
  ctx: Ctx,
  values: Omit<NewEpisodeEvent, "patientId" | "recordedByUserId" | "recordedByName" | "organisationId">,
  tx: Transaction,
  organisationId?: string | null,
) {
  const organisation = organisationId === undefined ? await organisationForRecord({ patientId: ctx.patientId, organisationIds: ctx.viewer.organisationIds }, tx) : organisationId;
  return insertEpisodeEvent({ values: { ...values, patientId: ctx.patientId, recordedByUserId: ctx.viewer.userId, recordedByName: ctx.viewer.name, organisationId: organisation } }, tx);
}

/** Device checks on the server; a stop without an override reason refuses the whole request. */
function assess(input: InsertionInput, patient: PatientForRecording, insertedAt: Date, timeZone: string) {
  const outcome = runDeviceCheck(input, patient, insertedAt, timeZone);
  if (!outcome.ok) {
    // The schema already bounds every field, so this only happens if the rules and the schema drift apart.
    throw new AppError("validation_failed", undefined, { fields: { [outcome.field]: ["out_of_range"] } });
  }
  const { missing, kept } = reconcileOverrides(outcome.findings, input.overrides);
  if (missing.length) {
    const fields: Record<string, string[]> = {};
    for (const code of missing) fields[`overrides.${code}`] = ["override_required"];
    throw new AppError("validation_failed", "A stop finding needs an override reason before saving.", { fields });
  }
  return { findings: outcome.findings, overrides: kept };
}

function episodeValues(
  input: InsertionInput,
  ctx: Ctx,
  extra: {
    organisationId: string | null;
    previousEpisodeId: string | null;
    findings: Finding[];
    overrides: { code: string; reason: string }[];
    timeZone: string;
    planning: PlanDefaults;
  },
): NewCatheterEpisode {
  const insertedAt = new Date(input.insertedAt);
  const plan = planDates(
    {
      insertedOn: dayIn(insertedAt, extra.timeZone),
      material: input.material,
      route: input.route,
      maxDwellDays: input.maxDwellDays,
      reviewIntervalDays: input.reviewIntervalDays,
    },
    {
      reviewIntervalDays: extra.planning.reviewIntervalDays,
      dueSoonDays: extra.planning.dueSoonDays,
      defaultMaxDwellDays: extra.planning.maxDwellDays,
    },
  );
  return {
    patientId: ctx.patientId,
    organisationId: extra.organisationId,
    previousEpisodeId: extra.previousEpisodeId,
    route: input.route,
    catheterType: input.catheterType,
    material: input.material,
    lengthCategory: input.lengthCategory,
    sizeCh: input.sizeCh,
    balloonMl: input.balloonMl,
    makerBalloonMl: input.makerBalloonMl ?? null,
    maker: input.maker ?? null,
    productName: input.productName ?? null,
    lot: input.lot ?? null,
    expiry: input.expiry ?? null,
    gtin: input.gtin ?? null,
    serial: input.serial ?? null,
    udi: input.udi ?? null,
    indication: input.indication,
    insertedAt,
    insertedByUserId: ctx.viewer.userId,
    insertedByName: ctx.viewer.name,
    gelKind: input.gelKind,
    gelVolumeMl: input.gelKind === "none" ? null : (input.gelVolumeMl ?? null),
    residualUrineMl: input.residualUrineMl ?? null,
    urineDescription: input.urineDescription ?? null,
    specimenTaken: input.specimenTaken,
    attempts: input.attempts,
    difficulties: input.difficulties ?? null,
    patientReaction: input.patientReaction ?? null,
    largerSizeReason: input.largerSizeReason ?? null,
    maxDwellDays: input.maxDwellDays ?? null,
    reviewIntervalDays: input.reviewIntervalDays ?? null,
    plannedChangeOn: plan.change.date,
    reviewDueOn: plan.review.date,
    findings: extra.findings,
    overrides: extra.overrides,
  };
}

/** What the history shows about the checks at the time of saving. */
function checkDetails(findings: Finding[], overrides: { code: string; reason: string }[], viewer: Viewer) {
  return {
    findings: findings.map((f) => ({ severity: f.severity, code: f.code, source: f.source })),
    overrides: overrides.map((o) => ({ ...o, byName: viewer.name })),
  };
}

export async function recordInsertion(ctx: Ctx, input: InsertionInput): Promise<RecordedEpisode> {
  const timeZone = deploymentTimeZone();
  return db.transaction(async (tx) => {
    const patient = await openForWrite(ctx, "episode.insert", tx);
    if (await getActiveEpisode({ patientId: ctx.patientId }, tx)) {
      throw new AppError("conflict", "A catheter is already in place: record a change or a removal.");
    }
    const insertedAt = new Date(input.insertedAt);
    const latest = await getLatestEpisode({ patientId: ctx.patientId }, tx);
    if (latest?.removedAt && insertedAt < latest.removedAt) {
      throw new AppError("validation_failed", undefined, { fields: { insertedAt: ["before_removal"] } });
    }
    const { findings, overrides } = assess(input, patient, insertedAt, timeZone);
    const organisationId = await organisationForRecord({ patientId: ctx.patientId, organisationIds: ctx.viewer.organisationIds }, tx);
    const episode = await insertEpisode(
      { values: episodeValues(input, ctx, { organisationId, previousEpisodeId: latest?.id ?? null, findings, overrides, timeZone, planning: await getPlanDefaults(tx) }) },
      tx,
    );
    // A catheter that went back in after a trial without catheter ends that trial, and puts a
    // patient discharged after an earlier trial back on the catheter caseload.
    if (latest?.awaitingTwoc) await closeTrialWithoutCatheter({ episodeId: latest.id }, tx);
    await setCatheterDischarge({ patientId: ctx.patientId, dischargedAt: null, followUpReviewOn: null }, tx);
    const eventId = await recordEvent(
      ctx,
      {
        episodeId: episode.id,
        kind: "insertion",
        occurredAt: insertedAt,
        details: checkDetails(findings, overrides, ctx.viewer),
      },
      tx,
      organisationId,
    );
    // The GP practice hears of it in this same transaction (docs/email.md).
    await queueGpSummary(tx, { patientId: ctx.patientId, eventId, cause: "insertion", actorName: ctx.viewer.name });
    return { episode: toEpisodeDto(episode), eventId, findings };
  });
}

export async function recordChange(ctx: Ctx, input: ChangeInput): Promise<RecordedEpisode & { previousEpisodeId: string }> {
  const timeZone = deploymentTimeZone();
  return db.transaction(async (tx) => {
    const patient = await openForWrite(ctx, "episode.change", tx);
    const current = await getActiveEpisode({ patientId: ctx.patientId }, tx);
    if (!current) throw new AppError("conflict", "No catheter is in place: record an insertion.");
    const insertedAt = new Date(input.insertedAt);
    if (insertedAt < current.insertedAt) {
      throw new AppError("validation_failed", undefined, { fields: { insertedAt: ["before_insertion"] } });
    }
    const { findings, overrides } = assess(input, patient, insertedAt, timeZone);
    const unplanned = input.changeKind === "unplanned";
    // The old catheter came out when the new one went in; the partial unique index allows the
    // new row only once the old one is closed, in this same transaction.
    const ended = await endEpisode(
      { episodeId: current.id, removedAt: insertedAt, removalReason: unplanned ? input.unplannedReason! : "planned change", awaitingTwoc: false },
      tx,
    );
    if (!ended) throw new AppError("conflict", "The catheter was changed by someone else meanwhile.");
    const organisationId = await organisationForRecord({ patientId: ctx.patientId, organisationIds: ctx.viewer.organisationIds }, tx);
    const episode = await insertEpisode(
      { values: episodeValues(input, ctx, { organisationId, previousEpisodeId: current.id, findings, overrides, timeZone, planning: await getPlanDefaults(tx) }) },
      tx,
    );
    const eventId = await recordEvent(
      ctx,
      {
        episodeId: episode.id,
        kind: unplanned ? "unplanned_change" : "planned_change",
        reason: unplanned ? input.unplannedReason! : null,
        notes: input.reasonNotes ?? null,
        occurredAt: insertedAt,
        details: { previousEpisodeId: current.id, needReviewed: input.needReviewed, ...checkDetails(findings, overrides, ctx.viewer) },
      },
      tx,
      organisationId,
    );
    // The GP practice hears of it in this same transaction (docs/email.md).
    await queueGpSummary(tx, { patientId: ctx.patientId, eventId, cause: "change", actorName: ctx.viewer.name });
    return { episode: toEpisodeDto(episode), eventId, findings, previousEpisodeId: current.id };
  });
}

export type RecordedRemoval = { episode: EpisodeDto; eventId: string };

export async function recordRemoval(ctx: Ctx, input: RemovalInput): Promise<RecordedRemoval> {
  return db.transaction(async (tx) => {
    await openForWrite(ctx, "episode.removal", tx);
    const current = await getActiveEpisode({ patientId: ctx.patientId }, tx);
    if (!current) throw new AppError("conflict", "No catheter is in place.");
    const removedAt = new Date(input.removedAt);
    if (removedAt < current.insertedAt) {
      throw new AppError("validation_failed", undefined, { fields: { removedAt: ["before_insertion"] } });
    }
    const startTwoc = input.startTwoc || input.reason === "trial-without-catheter";
    const ended = await endEpisode({ episodeId: current.id, removedAt, removalReason: input.reason, awaitingTwoc: startTwoc }, tx);
    if (!ended) throw new AppError("conflict", "The catheter was removed by someone else meanwhile.");
    const eventId = await recordEvent(
      ctx,
      {
        episodeId: current.id,
        kind: "removal",
        notes: input.notes ?? null,
        occurredAt: removedAt,
        details: {
          reason: input.reason,
          startTwoc,
          balloonDeflatedMl: input.balloonDeflatedMl ?? null,
          catheterIntact: input.catheterIntact,
        },
      },
      tx,
    );
    // The GP practice hears of it in this same transaction (docs/email.md).
    await queueGpSummary(tx, { patientId: ctx.patientId, eventId, cause: "removal", actorName: ctx.viewer.name });
    return { episode: toEpisodeDto(ended), eventId };
  });
}

export type RecordedTwoc = {
  episodeId: string;
  eventId: string;
  outcome: TwocInput["outcome"];
  totalVoidedMl: number;
  /** Where the form goes next: the insertion form after a failed trial and a new catheter. */
  next: "insertion" | null;
};

/** The removed catheter whose trial without catheter is under way, or null. */
export function trialInProgress(latest: CatheterEpisode | null): CatheterEpisode | null {
  return latest && latest.removedAt && latest.awaitingTwoc ? latest : null;
}

export async function recordTwoc(ctx: Ctx, input: TwocInput): Promise<RecordedTwoc> {
  return db.transaction(async (tx) => {
    await openForWrite(ctx, "episode.twoc", tx);
    if (await getActiveEpisode({ patientId: ctx.patientId }, tx)) {
      throw new AppError("conflict", "A catheter is in place: remove it for the trial first.");
    }
    const trial = trialInProgress(await getLatestEpisode({ patientId: ctx.patientId }, tx));
    if (!trial) throw new AppError("conflict", "No trial without catheter is under way: record the removal first.");
    const occurredAt = new Date(input.occurredAt);
    if (occurredAt < trial.removedAt!) {
      throw new AppError("validation_failed", undefined, { fields: { occurredAt: ["before_removal"] } });
    }
    if (input.followUpReviewOn) assertWithinYear(input.followUpReviewOn, "followUpReviewOn", "follow_up_range");
    await closeTrialWithoutCatheter({ episodeId: trial.id }, tx);
    if (input.discharge) await setCatheterDischarge({ patientId: ctx.patientId, dischargedAt: occurredAt, followUpReviewOn: input.followUpReviewOn! }, tx);
    const totalVoidedMl = input.voids.reduce((sum, v) => sum + v.volumeMl, 0);
    const eventId = await recordEvent(
      ctx,
      {
        episodeId: trial.id,
        kind: "twoc_outcome",
        twocOutcome: input.outcome,
        notes: input.notes ?? null,
        occurredAt,
        details: {
          voidsMl: input.voids.map((v) => v.volumeMl),
          voids: input.voids.map((v) => ({ at: v.at ?? null, volumeMl: v.volumeMl })),
          totalVoidedMl,
          postVoidResidualMl: input.postVoidResidualMl ?? null,
          symptoms: input.symptoms,
          reason: input.reason ?? null,
          failedAction: input.failedAction ?? null,
          followUpReviewOn: input.followUpReviewOn ?? null,
        },
      },
      tx,
    );
    // The GP practice hears of it in this same transaction (docs/email.md).
    await queueGpSummary(tx, { patientId: ctx.patientId, eventId, cause: "twoc", actorName: ctx.viewer.name });
    return {
      episodeId: trial.id,
      eventId,
      outcome: input.outcome,
      totalVoidedMl,
      next: input.outcome !== "passed" && input.failedAction === "re-catheterised" ? "insertion" : null,
    };
  });
}

/** A day from today to a year ahead in the deployment's zone, else the field's error (plain ISO dates compare as strings). */
function assertWithinYear(day: string, field: string, code: string) {
  const today = dayIn(new Date(), deploymentTimeZone());
  const yearOn = `${Number(today.slice(0, 4)) + 1}${today.slice(4)}`;
  if (day < today || day > yearOn) throw new AppError("validation_failed", undefined, { fields: { [field]: [code] } });
}

/** Plan (or clear) the trial without catheter of the catheter in place: its day and any medicine given before it. */
export async function planTwoc(ctx: Ctx, input: TwocPlanInput): Promise<{ plannedOn: string | null; medicineNote: string | null }> {
  return db.transaction(async (tx) => {
    await openForWrite(ctx, "episode.twoc-plan", tx);
    const active = await getActiveEpisode({ patientId: ctx.patientId }, tx);
    if (!active) throw new AppError("conflict", "No catheter is in place to plan a trial for.");
    if (input.plannedOn) assertWithinYear(input.plannedOn, "plannedOn", "plan_range");
    const plan = { plannedOn: input.plannedOn ?? null, medicineNote: input.plannedOn ? (input.medicineNote ?? null) : null };
    await setTwocPlan({ episodeId: active.id, ...plan }, tx);
    return plan;
  });
}

/**
 * The follow-up review of a patient discharged after a passed trial, kept in the record's history
 * on the catheter that came out; another review day keeps them on the caseload's "Follow-up
 * review" list, none ends the follow-up.
 */
export async function recordFollowUpReview(ctx: Ctx, input: FollowUpReviewInput): Promise<{ eventId: string; nextReviewOn: string | null }> {
  return db.transaction(async (tx) => {
    await openForWrite(ctx, "episode.follow-up-review", tx);
    const followUp = await getFollowUp({ patientId: ctx.patientId }, tx);
    const latest = await getLatestEpisode({ patientId: ctx.patientId }, tx);
    if (!followUp?.dischargedAt || !followUp.reviewOn || !latest?.removedAt) {
      throw new AppError("conflict", "No follow-up review is due: the patient is not discharged after a trial.");
    }
    if (input.nextReviewOn) assertWithinYear(input.nextReviewOn, "nextReviewOn", "follow_up_range");
    const reviewedAt = new Date(input.reviewedAt);
    if (reviewedAt < followUp.dischargedAt) throw new AppError("validation_failed", undefined, { fields: { reviewedAt: ["before_discharge"] } });
    const eventId = await recordEvent(
      ctx,
      {
        episodeId: latest.id,
        kind: "review",
        notes: input.notes,
        occurredAt: reviewedAt,
        details: { followUp: true, dueOn: followUp.reviewOn, nextReviewOn: input.nextReviewOn ?? null },
      },
      tx,
    );
    await setCatheterDischarge({ patientId: ctx.patientId, dischargedAt: followUp.dischargedAt, followUpReviewOn: input.nextReviewOn ?? null }, tx);
    return { eventId, nextReviewOn: input.nextReviewOn ?? null };
  });
}

/** The live check for a draft, for clients that cannot run lib/clinical themselves. */
export async function checkDraft(ctx: Ctx, input: DeviceCheckInput) {
  const timeZone = deploymentTimeZone();
  return db.transaction(async (tx) => {
    await openPatientRecord({ viewer: ctx.viewer, patientId: ctx.patientId, action: "episode.check", request: ctx.request }, tx);
    const patient = await getPatientForRecording({ patientId: ctx.patientId }, tx);
    if (!patient) throw new AppError("not_found");
    const outcome = runDeviceCheck(input, patient, input.insertedAt ? new Date(input.insertedAt) : new Date(), timeZone);
    if (!outcome.ok) throw new AppError("validation_failed", undefined, { fields: { [outcome.field]: ["out_of_range"] } });
    return outcome.findings;
  });
}
