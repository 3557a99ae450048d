import "server-only";
// A patient's catheter history: every episode (newest first) with its events, dwell days and why
// it ended, and the blockage pattern computed from it by lib/clinical.
import { asc, desc, eq } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import { catheterEpisodes, episodeEvents, observations, organisations, type CatheterEpisode } from "@/db/schema";
import { toObservationDto, type ObservationDto } from "./observations";
import {
  blockagePattern,
  parseIsoDate,
  type BlockagePattern,
  type CatheterHistoryEntry,
  type EndReason,
} from "@/lib/clinical";
import { dayIn, todayIso } from "@/lib/shared/time-zone";
import type { TwocOutcome } from "@/lib/clinical";

export type HistoryEvent = {
  id: string;
  kind: (typeof episodeEvents.$inferSelect)["kind"];
  reason: (typeof episodeEvents.$inferSelect)["reason"];
  twocOutcome: TwocOutcome | null;
  notes: string | null;
  details: Record<string, unknown>;
  occurredAt: string;
  recordedByName: string;
  organisationName: string | null;
  /** The NEWS2 observations taken on this visit, values and score. */
  observation: ObservationDto | null;
};

export type HistoryEpisode = {
  id: string;
  route: CatheterEpisode["route"];
  catheterType: CatheterEpisode["catheterType"];
  material: CatheterEpisode["material"];
  lengthCategory: CatheterEpisode["lengthCategory"];
  sizeCh: number;
  balloonMl: number;
  maker: string | null;
  lot: string | null;
  indication: string;
  insertedAt: string;
  insertedOn: string;
  insertedByName: string;
  organisationName: string | null;
  removedAt: string | null;
  removedOn: string | null;
  removalReason: string | null;
  /** Why it ended, in lib/clinical's terms (for the blockage pattern). */
  endReason: EndReason | null;
  /** Days from insertion to removal, or to today while in place. */
  dwellDays: number;
  inPlace: boolean;
  awaitingTwoc: boolean;
  plannedChangeOn: string;
  reviewDueOn: string;
  overrides: { code: string; reason: string }[];
  findings: { severity?: string; code?: string; message?: string }[];
  events: HistoryEvent[];
};

export type PatientHistory = {
  episodes: HistoryEpisode[];
  blockage: BlockagePattern;
  /** The maker's maximum dwell of the catheter in place, which caps the suggested interval. */
  maxDwellDays: number | null;
};

const END_REASON_WORDS: Record<string, EndReason> = {
  planned: "planned",
  "planned change": "planned",
  planned_change: "planned",
  blockage: "blockage",
  blocked: "blockage",
  bypassing: "bypassing",
  expelled: "expelled",
  removed: "removed",
  removal: "removed",
};

/**
 * Why an episode ended: the kind of the event that started the next catheter (an unplanned
 * change names its reason), else a removal event on the episode itself, else its removal reason.
 */
function endReasonOf(episode: { id: string; removedAt: Date | null; removalReason: string | null }, next: { events: { kind: string; reason: string | null }[] } | undefined, own: { kind: string }[]): EndReason | null {
  if (!episode.removedAt) return null;
  const started = next?.events.find((e) => e.kind === "unplanned_change" || e.kind === "planned_change");
  if (started?.kind === "planned_change") return "planned";
  if (started?.kind === "unplanned_change") {
    const r = started.reason ?? "other";
    return r === "blockage" || r === "bypassing" || r === "expelled" ? r : "other";
  }
  const word = episode.removalReason?.trim().toLowerCase();
  if (word && END_REASON_WORDS[word]) return END_REASON_WORDS[word];
  if (own.some((e) => e.kind === "removal" || e.kind === "twoc_outcome")) return "removed";
  return "other";
}

export async function getPatientHistory({ patientId, today = todayIso() }: { patientId: string; today?: string }, tx: Executor = db): Promise<PatientHistory> {
  const [episodeRows, eventRows] = await readTogether(
    tx,
    () => tx
      .select({ e: catheterEpisodes, organisationName: organisations.name })
      .from(catheterEpisodes)
      .leftJoin(organisations, eq(organisations.id, catheterEpisodes.organisationId))
      .where(eq(catheterEpisodes.patientId, patientId))
      .orderBy(asc(catheterEpisodes.insertedAt)),
    () => tx
      .select({ v: episodeEvents, organisationName: organisations.name, o: observations })
      .from(episodeEvents)
      .leftJoin(organisations, eq(organisations.id, episodeEvents.organisationId))
      .leftJoin(observations, eq(observations.eventId, episodeEvents.id))
      .where(eq(episodeEvents.patientId, patientId))
      .orderBy(desc(episodeEvents.occurredAt), desc(episodeEvents.createdAt)),
  );

  const eventsByEpisode = new Map<string, HistoryEvent[]>();
  for (const { v, organisationName, o } of eventRows) {
    const list = eventsByEpisode.get(v.episodeId) ?? [];
    list.push({
      id: v.id,
      kind: v.kind,
      reason: v.reason,
      twocOutcome: v.twocOutcome,
      notes: v.notes,
      details: v.details ?? {},
      occurredAt: v.occurredAt.toISOString(),
      recordedByName: v.recordedByName,
      organisationName,
      observation: o ? toObservationDto(o) : null,
    });
    eventsByEpisode.set(v.episodeId, list);
  }

  // The catheter that followed each one: by the link when recorded, else the next inserted.
  const byPrevious = new Map(episodeRows.filter((r) => r.e.previousEpisodeId).map((r) => [r.e.previousEpisodeId!, r.e.id]));
  const todayDay = parseIsoDate("today", today);
  const episodes: HistoryEpisode[] = episodeRows.map(({ e, organisationName }, i) => {
    const nextId = byPrevious.get(e.id) ?? episodeRows[i + 1]?.e.id;
    const own = eventsByEpisode.get(e.id) ?? [];
    const insertedOn = dayIn(e.insertedAt);
    const removedOn = e.removedAt ? dayIn(e.removedAt) : null;
    const endDay = removedOn ? parseIsoDate("removedOn", removedOn) : todayDay;
    return {
      id: e.id,
      route: e.route,
      catheterType: e.catheterType,
      material: e.material,
      lengthCategory: e.lengthCategory,
      sizeCh: e.sizeCh,
      balloonMl: e.balloonMl,
      maker: e.maker,
      lot: e.lot,
      indication: e.indication,
      insertedAt: e.insertedAt.toISOString(),
      insertedOn,
      insertedByName: e.insertedByName,
      organisationName,
      removedAt: e.removedAt ? e.removedAt.toISOString() : null,
      removedOn,
      removalReason: e.removalReason,
      endReason: endReasonOf(e, nextId ? { events: eventsByEpisode.get(nextId) ?? [] } : undefined, own),
      dwellDays: Math.max(0, endDay - parseIsoDate("insertedOn", insertedOn)),
      inPlace: !e.removedAt,
      awaitingTwoc: e.awaitingTwoc,
      plannedChangeOn: e.plannedChangeOn,
      reviewDueOn: e.reviewDueOn,
      overrides: Array.isArray(e.overrides) ? e.overrides : [],
      findings: Array.isArray(e.findings) ? (e.findings as HistoryEpisode["findings"]) : [],
      events: own,
    };
  });

  const entries: CatheterHistoryEntry[] = episodes
    .filter((e) => e.removedOn)
    .map((e) => ({ insertedOn: e.insertedOn, removedOn: e.removedOn!, endReason: e.endReason ?? undefined }));
  const current = episodeRows.find((r) => !r.e.removedAt)?.e;
  const maxDwellDays = current?.maxDwellDays ?? null;
  const blockage = blockagePattern(entries, maxDwellDays ? { maxDwellDays } : {});
  return { episodes: episodes.reverse(), blockage, maxDwellDays };
}
