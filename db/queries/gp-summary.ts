import "server-only";
// The facts a GP summary reports, read in the caller's transaction (so an event written a moment
// ago in the same transaction is seen) and again at send time for the PDF: both read the same
// rows, so the e-mail and its attachment agree.
import { and, asc, count, eq, gt, isNull, max } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import type { AllergyAnswers } from "@/lib/clinical";
import {
  careTeam,
  catheterEpisodes,
  episodeEvents,
  organisations,
  outboundMessages,
  passports,
  patients,
  type CatheterEpisode,
} from "@/db/schema";
import { charriereToMm } from "@/lib/clinical";
import { getLeadTeamContact } from "./contacts";
import { getLatestDischargeChecklist, listTransferTimeline } from "./referrals";
import type { TwocOutcome } from "@/lib/clinical";

export const gpSummaryCauses = ["passport", "insertion", "change", "removal", "twoc"] as const;
export type GpSummaryCause = (typeof gpSummaryCauses)[number];

export type DeviceFacts = {
  route: CatheterEpisode["route"];
  catheterType: CatheterEpisode["catheterType"];
  material: CatheterEpisode["material"];
  lengthCategory: CatheterEpisode["lengthCategory"];
  sizeCh: number;
  sizeMm: number | null;
  balloonMl: number;
  maker: string | null;
  productName: string | null;
  lot: string | null;
  expiry: string | null;
  insertedAt: string;
  insertedByName: string;
  indication: string;
  gelKind: CatheterEpisode["gelKind"];
  gelVolumeMl: number | null;
  difficulties: string | null;
  plannedChangeOn: string;
  reviewDueOn: string;
  removedAt: string | null;
  removalReason: string | null;
};

export type FindingFact = { severity: "stop" | "warn" | "info"; code: string; message: string; override: string | null };

export type GpSummaryFacts = {
  cause: GpSummaryCause;
  occurredAt: string;
  actorName: string;
  actorOrganisation: string | null;
  patient: {
    id: string;
    name: string;
    dateOfBirth: string;
    healthRecordNumber: string;
    allergies: AllergyAnswers & { other: string | null };
  };
  gp: { id: string; name: string; inboxEmail: string | null; locale: string } | null;
  careTeam: { name: string; phone: string | null; outOfHoursPhone: string | null }[];
  /** The lead team and its numbers (getLeadTeamContact): who the practice and the patient call. */
  lead: { name: string; phone: string | null; outOfHoursPhone: string | null } | null;
  /** The latest discharge checklist, when there is one. */
  checklist: {
    taught: string[];
    suppliesGiven: boolean;
    suppliesDays: number | null;
    drainage: "valve" | "bag" | null;
    plannedTwocOn: string | null;
    firstVisitOn: string | null;
    portalActivationGiven: boolean;
  } | null;
  /** This summary's number for the patient, and the one it replaces (with what happened since). */
  sequence: { number: number; previousAt: string | null; changes: { at: string; kind: string }[] };
  /** The catheter in place after the event (none after a removal or a passed trial). */
  device: DeviceFacts | null;
  /** The catheter taken out (change, removal, trial without catheter). */
  previous: DeviceFacts | null;
  event: { kind: string; reason: string | null; twocOutcome: TwocOutcome | null; notes: string | null; details: Record<string, unknown> } | null;
  passport: { issuedAt: string; languages: string[] } | null;
  findings: FindingFact[];
  refused: { code: string; detail: string | null }[];
};

function deviceFacts(e: CatheterEpisode): DeviceFacts {
  let sizeMm: number | null = null;
  try {
    sizeMm = charriereToMm(e.sizeCh);
  } catch {
    sizeMm = null;
  }
  return {
    route: e.route,
    catheterType: e.catheterType,
    material: e.material,
    lengthCategory: e.lengthCategory,
    sizeCh: e.sizeCh,
    sizeMm,
    balloonMl: e.balloonMl,
    maker: e.maker,
    productName: e.productName,
    lot: e.lot,
    expiry: e.expiry,
    insertedAt: e.insertedAt.toISOString(),
    insertedByName: e.insertedByName,
    indication: e.indication,
    gelKind: e.gelKind,
    gelVolumeMl: e.gelVolumeMl,
    difficulties: e.difficulties,
    plannedChangeOn: e.plannedChangeOn,
    reviewDueOn: e.reviewDueOn,
    removedAt: e.removedAt?.toISOString() ?? null,
    removalReason: e.removalReason,
  };
}

/** Findings worth a GP's attention: every stop and warning, with the reason it was overridden. */
function findingFacts(e: CatheterEpisode): FindingFact[] {
  const overrides = new Map((e.overrides ?? []).map((o) => [o.code, o.reason]));
  const out: FindingFact[] = [];
  for (const f of (e.findings ?? []) as { severity?: string; code?: string; message?: string }[]) {
    if (!f || (f.severity !== "stop" && f.severity !== "warn") || typeof f.code !== "string") continue;
    out.push({ severity: f.severity, code: f.code, message: String(f.message ?? ""), override: overrides.get(f.code) ?? null });
  }
  return out;
}

function refusedFrom(details: Record<string, unknown> | undefined): { code: string; detail: string | null }[] {
  const list = details?.refused;
  if (!Array.isArray(list)) return [];
  return list
    .filter((r): r is { code: string; detail?: unknown } => !!r && typeof (r as { code?: unknown }).code === "string")
    .map((r) => ({ code: r.code, detail: typeof r.detail === "string" ? r.detail : null }));
}

export async function loadGpSummaryFacts(
  {
    patientId,
    eventId,
    passportId,
    cause,
    actorName,
    refused = [],
    sequence,
  }: {
    /** Fixed when the summary is queued (its number, the earlier one's time), so the PDF made at send time agrees. */
    sequence?: { number: number; previousAt: string | null };
    patientId: string;
    eventId?: string | null;
    passportId?: string | null;
    cause: GpSummaryCause;
    actorName: string;
    refused?: { code: string; detail?: string | null }[];
  },
  tx: Executor = db,
): Promise<GpSummaryFacts> {
  const [p] = await tx.select().from(patients).where(eq(patients.id, patientId));
  if (!p) throw new Error(`GP summary: patient ${patientId} not found`);
  const gpRow = p.gpPracticeId ? (await tx.select().from(organisations).where(eq(organisations.id, p.gpPracticeId)))[0] : undefined;
  const team = await tx
    .select({ name: organisations.name, phone: organisations.phone, outOfHoursPhone: organisations.outOfHoursPhone })
    .from(careTeam)
    .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
    .where(eq(careTeam.patientId, patientId))
    .orderBy(asc(organisations.name));
  const [active] = await tx
    .select()
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));

  let occurredAt = new Date();
  let actorOrganisation: string | null = null;
  let device: CatheterEpisode | undefined = active;
  let previous: CatheterEpisode | undefined;
  let event: GpSummaryFacts["event"] = null;
  let passport: GpSummaryFacts["passport"] = null;
  const refusedAll = refused.map((r) => ({ code: r.code, detail: r.detail ?? null }));

  if (cause === "passport") {
    if (!passportId) throw new Error("GP summary for a passport needs passportId");
    const [pp] = await tx.select().from(passports).where(and(eq(passports.id, passportId), eq(passports.patientId, patientId)));
    if (!pp) throw new Error(`GP summary: passport ${passportId} not found`);
    occurredAt = pp.issuedAt;
    passport = { issuedAt: pp.issuedAt.toISOString(), languages: pp.languages };
  } else {
    if (!eventId) throw new Error(`GP summary for ${cause} needs eventId`);
    const [ev] = await tx.select().from(episodeEvents).where(and(eq(episodeEvents.id, eventId), eq(episodeEvents.patientId, patientId)));
    if (!ev) throw new Error(`GP summary: event ${eventId} not found`);
    occurredAt = ev.occurredAt;
    event = { kind: ev.kind, reason: ev.reason, twocOutcome: ev.twocOutcome, notes: ev.notes, details: ev.details };
    refusedAll.push(...refusedFrom(ev.details));
    if (ev.organisationId) {
      const [org] = await tx.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, ev.organisationId));
      actorOrganisation = org?.name ?? null;
    }
    const [evEpisode] = await tx.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, ev.episodeId));
    if (cause === "insertion" || cause === "change") {
      // The event belongs to the new catheter; the one it replaced is its previous episode.
      device = evEpisode;
      if (evEpisode?.previousEpisodeId) {
        [previous] = await tx.select().from(catheterEpisodes).where(eq(catheterEpisodes.id, evEpisode.previousEpisodeId));
      }
    } else {
      // Removal and trial without catheter: the event's catheter came out; another may be in.
      previous = evEpisode;
      device = active && active.id !== evEpisode?.id ? active : undefined;
    }
  }
  const findingsFrom = cause === "insertion" || cause === "change" ? device : undefined;
  const [lead, checklistRow] = await readTogether(tx, () => getLeadTeamContact({ patientId }, tx), () => getLatestDischargeChecklist({ patientId }, tx));
  const seq = sequence ?? (await gpSummarySequence({ patientId }, tx));
  const changes: { at: string; kind: string }[] = [];
  if (seq.previousAt) {
    const since = new Date(seq.previousAt);
    const events = await tx
      .select({ at: episodeEvents.occurredAt, kind: episodeEvents.kind })
      .from(episodeEvents)
      .where(and(eq(episodeEvents.patientId, patientId), gt(episodeEvents.occurredAt, since)))
      .orderBy(asc(episodeEvents.occurredAt));
    for (const e of events) changes.push({ at: e.at.toISOString(), kind: `event:${e.kind}` });
    for (const e of (await listTransferTimeline({ patientId }, tx)).filter((x) => new Date(x.at) > since && x.action !== "referral.remind").reverse()) {
      changes.push({ at: e.at, kind: `transfer:${e.action}` });
    }
    changes.sort((a, b) => a.at.localeCompare(b.at));
  }
  return {
    cause,
    occurredAt: occurredAt.toISOString(),
    actorName,
    actorOrganisation,
    patient: {
      id: p.id,
      name: `${p.givenName} ${p.familyName}`,
      dateOfBirth: p.dateOfBirth,
      healthRecordNumber: p.healthRecordNumber,
      allergies: { latex: p.allergyLatex, chlorhexidine: p.allergyChlorhexidine, lidocaine: p.allergyLidocaine, other: p.allergyOther },
    },
    gp: gpRow ? { id: gpRow.id, name: gpRow.name, inboxEmail: gpRow.inboxEmail, locale: gpRow.locale } : null,
    careTeam: team,
    lead: lead ? { name: lead.name, phone: lead.phone, outOfHoursPhone: lead.outOfHoursPhone } : null,
    checklist: checklistRow
      ? {
          taught: checklistRow.taught,
          suppliesGiven: checklistRow.suppliesGiven,
          suppliesDays: checklistRow.suppliesDays,
          drainage: checklistRow.drainage,
          plannedTwocOn: checklistRow.plannedTwocOn,
          firstVisitOn: checklistRow.firstVisitOn,
          portalActivationGiven: checklistRow.portalActivationGiven,
        }
      : null,
    sequence: { number: seq.number, previousAt: seq.previousAt, changes },
    device: device ? deviceFacts(device) : null,
    previous: previous ? deviceFacts(previous) : null,
    event,
    passport,
    findings: findingsFrom ? findingFacts(findingsFrom) : [],
    refused: refusedAll,
  };
}

/**
 * The number the next GP summary of this patient takes (earlier summaries, not counting resends)
 * and when the latest of them was written: a later summary says which one it replaces.
 */
export async function gpSummarySequence({ patientId }: { patientId: string }, tx: Executor = db) {
  const [row] = await tx
    .select({ n: count(), last: max(outboundMessages.createdAt) })
    .from(outboundMessages)
    .where(and(eq(outboundMessages.patientId, patientId), eq(outboundMessages.kind, "gp-summary"), isNull(outboundMessages.resendOfId)));
  return { number: Number(row?.n ?? 0) + 1, previousAt: row?.last ? new Date(row.last).toISOString() : null };
}
