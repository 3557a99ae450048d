import "server-only";
import { desc, eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { outboundMessages, supplyRequests, type NewSupplyRequest } from "@/db/schema";
import { parseIsoDate, supplyChangeInterval } from "@/lib/clinical";
import { blockagePatternOf } from "@/lib/shared/blockage-interval";
import { deploymentTimeZone, todayIso } from "@/lib/shared/time-zone";
import { listEpisodeEndings } from "./episodes";
import { getSpareCatheters } from "@/lib/config/settings";
import { getActiveEpisode, getOrganisation, getPatientForMail } from "./mail-context";

/** What a supply request starts from: the catheter in place, its planned change interval, the GP. */
export async function getSupplyContext({ patientId }: { patientId: string }, tx: Executor = db) {
  const patient = await getPatientForMail({ patientId }, tx);
  if (!patient) return null;
  const episode = await getActiveEpisode({ patientId }, tx);
  const gp = patient.gpPracticeId ? await getOrganisation({ id: patient.gpPracticeId }, tx) : null;
  let changeIntervalDays: number | null = null;
  let plannedIntervalDays: number | null = null;
  let firstChangeInDays: number | null = null;
  if (episode) {
    const inserted = parseIsoDate("insertedOn", episode.insertedAt.toISOString().slice(0, 10));
    plannedIntervalDays = Math.max(1, parseIsoDate("plannedChangeOn", episode.plannedChangeOn) - inserted);
    // Supplies follow the real next change day and, when the catheters block sooner, the
    // blockage pattern's interval (lib/clinical supplyChangeInterval).
    const pattern = blockagePatternOf(await listEpisodeEndings({ patientId }, tx), deploymentTimeZone(), episode.maxDwellDays ?? undefined);
    changeIntervalDays = supplyChangeInterval(plannedIntervalDays, pattern?.suggestedIntervalDays);
    // The next change: the planned day, or sooner when the blockage interval from insertion comes first.
    const today = parseIsoDate("today", todayIso());
    const next = Math.min(parseIsoDate("plannedChangeOn", episode.plannedChangeOn), inserted + changeIntervalDays);
    firstChangeInDays = Math.min(366, Math.max(0, next - today));
  }
  return { patient, episode, gp, changeIntervalDays, plannedIntervalDays, firstChangeInDays, spareCatheters: await getSpareCatheters(tx) };
}

export async function insertSupplyRequest({ values }: { values: NewSupplyRequest }, tx: Executor = db) {
  const [row] = await tx.insert(supplyRequests).values(values).returning();
  return row;
}

export async function setSupplyRequestMessage({ id, messageId }: { id: string; messageId: string }, tx: Executor = db) {
  await tx.update(supplyRequests).set({ messageId }).where(eq(supplyRequests.id, id));
}

export type SupplyRequestDto = {
  id: string;
  periodDays: number;
  items: { item: string; computed: number; quantity: number; intervalDays: number }[];
  note: string | null;
  requestedByName: string;
  createdAt: string;
  message: { id: string; status: string; to: string; sentAt: string | null; lastError: string | null } | null;
};

export async function listSupplyRequests({ patientId }: { patientId: string }, tx: Executor = db): Promise<SupplyRequestDto[]> {
  const rows = await tx
    .select({ r: supplyRequests, m: outboundMessages })
    .from(supplyRequests)
    .leftJoin(outboundMessages, eq(outboundMessages.id, supplyRequests.messageId))
    .where(eq(supplyRequests.patientId, patientId))
    .orderBy(desc(supplyRequests.createdAt));
  return rows.map(({ r, m }) => ({
    id: r.id,
    periodDays: r.periodDays,
    items: r.items,
    note: r.note,
    requestedByName: r.requestedByName,
    createdAt: r.createdAt.toISOString(),
    message: m ? { id: m.id, status: m.status, to: m.toAddress, sentAt: m.sentAt?.toISOString() ?? null, lastError: m.lastError } : null,
  }));
}
