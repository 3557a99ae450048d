import "server-only";
// What the FHIR export needs of one patient (access is checked by the caller).
import { and, asc, eq } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import { catheterEpisodes, episodeEvents, observations, organisations, patients } from "@/db/schema";
import { getCareTeamOrganisations } from "@/db/queries/mail-context";
import { alertTeams } from "@/lib/records/alert-team";
import type { FhirInput } from "@/lib/fhir/export";
import { twocResult } from "@/lib/shared/twoc-result";

export async function getFhirExportData({ patientId }: { patientId: string }, tx: Executor = db): Promise<Omit<FhirInput, "identifierSystem" | "now" | "words"> | null> {
  const [p] = await tx
    .select({
      id: patients.id,
      givenName: patients.givenName,
      familyName: patients.familyName,
      healthRecordNumber: patients.healthRecordNumber,
      dateOfBirth: patients.dateOfBirth,
      sex: patients.sex,
      preferredLocale: patients.preferredLocale,
    })
    .from(patients)
    .where(eq(patients.id, patientId));
  if (!p) return null;
  const [episodes, obs, visits, team, lead, trials] = await readTogether(
    tx,
    () => tx
      .select({
        id: catheterEpisodes.id,
        route: catheterEpisodes.route,
        catheterType: catheterEpisodes.catheterType,
        material: catheterEpisodes.material,
        sizeCh: catheterEpisodes.sizeCh,
        balloonMl: catheterEpisodes.balloonMl,
        maker: catheterEpisodes.maker,
        productName: catheterEpisodes.productName,
        lot: catheterEpisodes.lot,
        expiry: catheterEpisodes.expiry,
        gtin: catheterEpisodes.gtin,
        serial: catheterEpisodes.serial,
        udi: catheterEpisodes.udi,
        indication: catheterEpisodes.indication,
        insertedAt: catheterEpisodes.insertedAt,
        removedAt: catheterEpisodes.removedAt,
      })
      .from(catheterEpisodes)
      .where(eq(catheterEpisodes.patientId, patientId))
      .orderBy(asc(catheterEpisodes.insertedAt)),
    () => tx.select().from(observations).where(eq(observations.patientId, patientId)).orderBy(asc(observations.takenAt)),
    () => tx
      .select({ id: episodeEvents.id, occurredAt: episodeEvents.occurredAt, recordedByName: episodeEvents.recordedByName, organisationName: organisations.name })
      .from(episodeEvents)
      .leftJoin(organisations, eq(organisations.id, episodeEvents.organisationId))
      .where(and(eq(episodeEvents.patientId, patientId), eq(episodeEvents.kind, "visit")))
      .orderBy(asc(episodeEvents.occurredAt)),
    () => getCareTeamOrganisations({ patientId }, tx),
    // The lead team is the one alerts go to (lib/records/alert-team.ts).
    () => alertTeams({ patientId }, tx),
    () => tx
      .select({
        id: episodeEvents.id,
        episodeId: episodeEvents.episodeId,
        occurredAt: episodeEvents.occurredAt,
        outcome: episodeEvents.twocOutcome,
        details: episodeEvents.details,
        recordedByName: episodeEvents.recordedByName,
      })
      .from(episodeEvents)
      .where(and(eq(episodeEvents.patientId, patientId), eq(episodeEvents.kind, "twoc_outcome")))
      .orderBy(asc(episodeEvents.occurredAt)),
  );
  const leadIds = new Set(lead.map((o) => o.id));
  return {
    patient: p,
    episodes,
    visits,
    trials: trials.flatMap((t) =>
      t.outcome ? [{ id: t.id, episodeId: t.episodeId, occurredAt: t.occurredAt, outcome: t.outcome, result: twocResult(t.details), recordedByName: t.recordedByName }] : [],
    ),
    careTeam: team.map((o) => ({ id: o.id, name: o.name, lead: leadIds.has(o.id) })),
    observations: obs.map((o) => ({
      id: o.id,
      eventId: o.eventId,
      takenAt: o.takenAt,
      total: o.news2Total,
      subscores: o.news2Subscores,
      risk: o.news2Risk,
      respirationRate: o.respirationRate,
      spo2: o.spo2,
      spo2Scale: o.spo2Scale,
      onOxygen: o.onOxygen,
      systolicBp: o.systolicBp,
      pulse: o.pulse,
      consciousness: o.consciousness,
      temperatureC: Number(o.temperatureC),
      recordedByName: o.recordedByName,
    })),
  };
}
