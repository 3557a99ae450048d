import "server-only";
// Recording a visit, with NEWS2 observations when taken: in one transaction the access check and
// audit (openPatientRecord: care team or visit access), the visit event, the observations with
// the score lib/clinical gives here (whatever the browser showed), and for a medium or high band
// the care-team alert in the outbox. Any error rolls everything back.
import { db } from "@/db";
import { getLatestEpisode, insertEpisodeEvent, organisationForRecord } from "@/db/queries/episodes";
import { getOrganisation } from "@/db/queries/mail-context";
import { insertObservation, toObservationDto, type ObservationDto } from "@/db/queries/observations";
import type { Viewer } from "@/lib/auth/session";
import { ClinicalInputError, scoreNews2 } from "@/lib/clinical";
import { isAlertLevel } from "@/lib/email/care-team-alert";
import { raiseAlert, raiseSampleToChase } from "@/lib/records/caseload-items";
import { AppError } from "@/lib/http/errors";
import { openPatientRecord } from "@/lib/records/patient-record";
import { assertRecordOpen } from "@/lib/records/record-state";
import type { ObservationsInput, VisitInput } from "@/lib/validations/visit";

type Ctx = { viewer: Viewer; patientId: string; request: Request };

export type RecordedVisit = { eventId: string; observation: ObservationDto | null; alerted: number; sampleToChase: boolean; catheterChanged: boolean };

/** The alert's plain-words summary (English: the outbox renders the rest in each team's language). */
function summary(o: ObservationsInput) {
  return [
    `RR ${o.respirationRate}/min`,
    `SpO2 ${o.spo2} % (scale ${o.spo2Scale}, ${o.onOxygen ? "on oxygen" : "on air"})`,
    `SBP ${o.systolicBp} mmHg`,
    `pulse ${o.pulse}/min`,
    `ACVPU ${o.consciousness}`,
    `${o.temperatureC.toFixed(1)} °C`,
  ].join(", ");
}

export async function recordVisit(ctx: Ctx, input: VisitInput): Promise<RecordedVisit> {
  let score: ReturnType<typeof scoreNews2> | null = null;
  if (input.observations) {
    try {
      score = scoreNews2(input.observations);
    } catch (e) {
      // The schema and the rule share their bounds; this only fires if they drift apart.
      if (e instanceof ClinicalInputError) throw new AppError("validation_failed", undefined, { fields: { [`observations.${e.field}`]: ["out_of_range"] } });
      throw e;
    }
  }
  return db.transaction(async (tx) => {
    const via = await openPatientRecord({ viewer: ctx.viewer, patientId: ctx.patientId, action: "visit.create", request: ctx.request }, tx);
    await assertRecordOpen(tx, ctx.patientId);
    const episode = await getLatestEpisode({ patientId: ctx.patientId }, tx);
    if (!episode) throw new AppError("conflict", "No catheter is recorded for this patient.");
    const occurredAt = new Date(input.occurredAt);
    const organisationId = await organisationForRecord({ patientId: ctx.patientId, organisationIds: ctx.viewer.organisationIds }, tx);
    const eventId = await insertEpisodeEvent(
      {
        values: {
          episodeId: episode.id,
          patientId: ctx.patientId,
          kind: "visit",
          notes: input.notes ?? null,
          occurredAt,
          recordedByUserId: ctx.viewer.userId,
          recordedByName: ctx.viewer.name,
          organisationId,
          details: { via, ...(score ? { news2Total: score.total, news2Risk: score.risk } : {}), ...(input.findings ? { findings: input.findings } : {}) },
        },
      },
      tx,
    );
    const org = organisationId ? await getOrganisation({ id: organisationId }, tx) : null;
    const reporter = { kind: "clinician" as const, name: ctx.viewer.name, organisation: org?.name ?? null, phone: org?.phone ?? null };
    // A sample sent stays on the caseload as a result to chase until someone marks it done.
    const sampleToChase = Boolean(input.findings?.sampleSent);
    if (sampleToChase) {
      await raiseSampleToChase(tx, { patientId: ctx.patientId, eventId, summary: `Urine sample sent at the visit of ${occurredAt.toISOString().slice(0, 10)}.`, reporter });
    }
    const done = { sampleToChase, catheterChanged: Boolean(input.findings?.catheterChanged) };
    if (!input.observations || !score) return { eventId, observation: null, alerted: 0, ...done };
    const o = input.observations;
    const row = await insertObservation(
      {
        values: {
          patientId: ctx.patientId,
          eventId,
          takenAt: occurredAt,
          respirationRate: o.respirationRate,
          spo2: o.spo2,
          spo2Scale: o.spo2Scale,
          onOxygen: o.onOxygen,
          systolicBp: o.systolicBp,
          pulse: o.pulse,
          consciousness: o.consciousness,
          temperatureC: o.temperatureC,
          news2Total: score.total,
          news2Subscores: score.subscores,
          news2Risk: score.risk,
          news2Response: score.response.key,
          recordedByUserId: ctx.viewer.userId,
          recordedByName: ctx.viewer.name,
          organisationId,
        },
      },
      tx,
    );
    let alerts: unknown[] = [];
    if (isAlertLevel("news2", score.risk)) {
      // Named in the alert so the team can call the visiting clinician back.
      alerts = await raiseAlert(tx, {
        patientId: ctx.patientId,
        kind: "news2",
        level: score.risk,
        score: score.total,
        summary: summary(o),
        reporter,
        notes: input.notes ?? null,
        observationId: row.id,
        eventId,
      });
    }
    return { eventId, observation: toObservationDto(row), alerted: alerts.length, ...done };
  });
}
