import "server-only";
// What the FHIR export needs of one patient (access is checked by the caller).
import { asc, eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { catheterEpisodes, observations, patients } from "@/db/schema";
import type { FhirInput } from "@/lib/fhir/export";

export async function getFhirExportData({ patientId }: { patientId: string }, tx: Executor = db): Promise<Omit<FhirInput, "base" | "now"> | null> {
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
  const [episodes, obs] = await Promise.all([
    tx
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
    tx.select().from(observations).where(eq(observations.patientId, patientId)).orderBy(asc(observations.takenAt)),
  ]);
  return {
    patient: p,
    episodes,
    observations: obs.map((o) => ({
      id: o.id,
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
