import "server-only";
// The summary a GP practice receives on passport issue, on each insertion or change, on removal
// and on each trial-without-catheter outcome: HTML and text in the practice's language, with a
// PDF of the same content attached (rendered at send time from the same rows).
import type { Executor } from "@/db";
import { db } from "@/db";
import { getRegion } from "@/lib/config/settings";
import { loadGpSummaryFacts, type DeviceFacts, type GpSummaryCause, type GpSummaryFacts } from "@/db/queries/gp-summary";
import { emailDates, emailLocale, emailTranslator, emailVocabulary, type EmailT, type EmailV } from "./i18n";
import { queueMessage, type QueuedMessage } from "./outbox";
import { renderEmail, type Block, type EmailContent } from "./render";
import { DISCHARGE_TEACHING, REMOVAL_REASONS, suppliesFor, type SupplyList } from "@/lib/clinical";
import { twocResult, voidsText } from "@/lib/shared/twoc-result";
import { allergySummary } from "@/lib/clinical/allergies";

export type { GpSummaryCause, GpSummaryFacts };

export type QueueGpSummaryInput = {
  patientId: string;
  /** The episode event (insertion, change, removal, TWOC outcome) that caused the summary. */
  eventId?: string;
  /** For cause "passport": the passport just issued. */
  passportId?: string;
  cause: GpSummaryCause;
  /** Who did it, as it should read to the GP (e.g. "Grace Mensah"). */
  actorName: string;
  /** Findings the form refused and the clinician did not override (e.g. an expired device not used). */
  refused?: { code: string; detail?: string | null }[];
};

export function gpSummaryKey(input: Pick<QueueGpSummaryInput, "cause" | "eventId" | "passportId">) {
  return `gp-summary:${input.cause}:${input.cause === "passport" ? input.passportId : input.eventId}`;
}

const knownFindings = new Set([
  "device-expired",
  "device-expiring-soon",
  "latex-allergy",
  "chlorhexidine-allergy",
  "lidocaine-allergy",
  "female-length-male",
  "balloon-differs-from-maker",
  "size-larger-than-routine",
  "dwell-over-12-weeks",
]);

function findingName(t: EmailT, code: string, message: string): string {
  return knownFindings.has(code) ? t(`enum.finding.${code as "device-expired"}`) : message || code;
}

/** The allergies, then those nobody has asked about ("not recorded"); "none recorded" only when all were asked. */
export function allergyText(t: EmailT, v: EmailV, a: GpSummaryFacts["patient"]["allergies"]): string {
  const { present, notRecorded } = allergySummary(a);
  const list = [...present.map((k) => v(`allergen.${k}`)), ...(a.other?.trim() ? [a.other.trim()] : [])];
  const unknown = notRecorded.length ? t("gp.allergyNotRecorded", { allergens: notRecorded.map((k) => v(`allergen.${k}`)).join(", ") }) : null;
  if (!list.length && !unknown) return t("common.noneRecorded");
  return [list.join(", "), unknown].filter(Boolean).join(". ");
}

export function deviceRows(t: EmailT, v: EmailV, d: ReturnType<typeof emailDates>, dev: DeviceFacts, { dates }: { dates: boolean }) {
  const rows: { label: string; value: string }[] = [
    { label: v("device.route"), value: v(`route.${dev.route}`) },
    { label: v("device.type"), value: v(`catheterType.${dev.catheterType}`) },
    { label: v("device.material"), value: v(`material.${dev.material}`) },
    { label: v("device.length"), value: v(`lengthCategory.${dev.lengthCategory}`) },
    {
      label: v("device.size"),
      value: dev.sizeMm !== null ? v("device.sizeMm", { ch: dev.sizeCh, mm: d.number(dev.sizeMm) }) : v("device.sizeCh", { ch: dev.sizeCh }),
    },
    { label: v("device.balloon"), value: v("device.balloonWater", { ml: dev.balloonMl }) },
  ];
  const maker = [dev.maker, dev.productName].filter(Boolean).join(", ");
  if (maker) rows.push({ label: v("device.maker"), value: maker });
  rows.push({ label: v("device.lot"), value: dev.lot || t("common.noneRecorded") });
  rows.push({ label: v("device.expiry"), value: dev.expiry ? d.short(dev.expiry) : t("common.noneRecorded") });
  rows.push({ label: t("device.inserted"), value: t("device.insertedValue", { date: d.at(new Date(dev.insertedAt)), name: dev.insertedByName }) });
  rows.push({ label: v("device.indication"), value: dev.indication });
  rows.push({
    label: t("device.gel"),
    value: dev.gelVolumeMl ? t("device.gelValue", { gel: v(`gelKind.${dev.gelKind}`), ml: dev.gelVolumeMl }) : v(`gelKind.${dev.gelKind}`),
  });
  if (dev.difficulties) rows.push({ label: t("device.difficulties"), value: dev.difficulties });
  if (dates) {
    rows.push({ label: t("device.plannedChange"), value: d.day(dev.plannedChangeOn) });
    rows.push({ label: t("device.reviewDue"), value: d.day(dev.reviewDueOn) });
  }
  return rows;
}

export function careTeamLines(t: EmailT, team: GpSummaryFacts["careTeam"]): string[] {
  return team.map((o) => {
    const base = o.phone ? t("common.teamLine", { name: o.name, phone: o.phone }) : o.name;
    return o.outOfHoursPhone ? `${base} ${t("common.outOfHours", { phone: o.outOfHoursPhone })}` : base;
  });
}

/** A month's prescription: the usual period of a repeat prescription (common practice, no source). */
export const GP_SUPPLY_DAYS = 28;

const dayNumber = (ymd: string) => Math.floor(Date.parse(`${ymd.slice(0, 10)}T00:00:00Z`) / 86_400_000);

/**
 * What the practice is asked to prescribe: supplies (lib/clinical suppliesFor) for a month, or
 * only until the planned trial without catheter. Null with no catheter in place.
 */
export function gpSupplies(facts: GpSummaryFacts): { list: SupplyList; twocOn: string | null } | null {
  const dev = facts.device;
  if (!dev) return null;
  const today = dayNumber(facts.occurredAt);
  const twocOn = facts.checklist?.plannedTwocOn && dayNumber(facts.checklist.plannedTwocOn) >= today ? facts.checklist.plannedTwocOn : null;
  const days = twocOn ? Math.min(GP_SUPPLY_DAYS, Math.max(1, dayNumber(twocOn) - today)) : GP_SUPPLY_DAYS;
  const changeIntervalDays = Math.min(366, Math.max(1, dayNumber(dev.plannedChangeOn) - dayNumber(dev.insertedAt)));
  const valve = facts.checklist?.drainage === "valve";
  return { list: suppliesFor({ changeIntervalDays, valve, legBag: !valve }, days), twocOn };
}

/** Language codes as names in the reader's language ("Polish", not "pl"). */
export function languageNames(codes: readonly string[], locale: string): string {
  const names = new Intl.DisplayNames([locale], { type: "language" });
  return codes.map((c) => names.of(c) ?? c).join(", ");
}

/** The summary as one content model, for the e-mail (HTML and text) and the PDF alike. */
export function gpSummaryContent(facts: GpSummaryFacts, locale: string, region: string | null): EmailContent {
  const t = emailTranslator(locale);
  const v = emailVocabulary(locale);
  const d = emailDates(locale, region);
  const c = facts.cause;
  const actor = facts.actorOrganisation ? t("common.actorAt", { name: facts.actorName, organisation: facts.actorOrganisation }) : facts.actorName;
  const blocks: Block[] = [];
  const supplies = gpSupplies(facts);

  // First, in one line: what the practice needs to do.
  const action = !facts.device
    ? t("gp.action.nothing")
    : supplies?.twocOn
      ? t("gp.action.twoc", { date: d.day(supplies.twocOn), days: supplies.list.days })
      : t("gp.action.prescribe", { days: supplies?.list.days ?? GP_SUPPLY_DAYS });
  blocks.push({ type: "notice", tone: "info", label: t("gp.action.label"), text: action });
  if (facts.sequence.previousAt) {
    blocks.push({ type: "notice", tone: "warn", label: t("gp.replaces.label"), text: t("gp.replaces.text", { number: facts.sequence.number, date: d.at(new Date(facts.sequence.previousAt)) }) });
    blocks.push({ type: "heading", text: t("gp.replaces.changesHeading") });
    blocks.push(
      facts.sequence.changes.length
        ? {
            type: "list",
            items: facts.sequence.changes.map((c) => {
              const [source, kind] = c.kind.split(":");
              const what = source === "event" ? v(`eventKind.${kind as "insertion"}`) : t(`gp.replaces.transfer.${kind as "referral.accept"}`);
              return `${d.at(new Date(c.at))}: ${what}`;
            }),
          }
        : { type: "paragraph", text: t("gp.replaces.noChanges") },
    );
  }

  blocks.push({ type: "heading", text: t("gp.careHeading") });
  const careRows = [{ label: t("gp.responsibleNurse"), value: actor }];
  if (facts.lead) {
    const day = facts.lead.phone ? t("common.teamLine", { name: facts.lead.name, phone: facts.lead.phone }) : facts.lead.name;
    careRows.push({ label: t("gp.leadTeam"), value: facts.lead.outOfHoursPhone ? `${day} ${t("common.outOfHours", { phone: facts.lead.outOfHoursPhone })}` : day });
  }
  if (supplies?.twocOn) careRows.push({ label: t("gp.twocPlanned"), value: t("gp.awaitingTwoc", { date: d.day(supplies.twocOn) }) });
  blocks.push({ type: "facts", rows: careRows });

  blocks.push({ type: "heading", text: t("gp.patient") });
  blocks.push({
    type: "facts",
    rows: [
      { label: t("gp.name"), value: facts.patient.name },
      { label: t("gp.dateOfBirth"), value: d.short(facts.patient.dateOfBirth) },
      { label: t("gp.healthRecordNumber"), value: facts.patient.healthRecordNumber },
      { label: t("gp.allergies"), value: allergyText(t, v, facts.patient.allergies) },
    ],
  });

  if (c === "removal" || c === "twoc") {
    blocks.push({ type: "heading", text: c === "twoc" ? t("gp.twocHeading") : t("gp.removalHeading") });
    const rows: { label: string; value: string }[] = [{ label: t("gp.when"), value: d.at(new Date(facts.occurredAt)) }];
    if (c === "twoc" && facts.event?.twocOutcome) {
      rows.push({ label: t("gp.twocOutcome"), value: v(`twocOutcome.${facts.event.twocOutcome}`) });
      // The voids, the residual and what was done (the same reading as History's).
      const result = twocResult(facts.event.details);
      rows.push({ label: t("gp.twocVoids"), value: result.voids.length ? t("gp.twocVoidsValue", { list: voidsText(result, (n) => `${n} ml`), total: result.totalVoidedMl }) : t("gp.twocNoVoids") });
      if (result.postVoidResidualMl !== null) rows.push({ label: t("gp.twocResidual"), value: `${result.postVoidResidualMl} ml` });
      if (result.symptoms.length) rows.push({ label: t("gp.twocSymptoms"), value: result.symptoms.map((s) => v(`twocSymptom.${s}`)).join(", ") });
      if (result.reason) rows.push({ label: t("gp.twocReason"), value: result.reason });
      if (result.failedAction) rows.push({ label: t("gp.twocAction"), value: v(`failedAction.${result.failedAction}`) });
    }
    const reason = facts.previous?.removalReason;
    if (c === "removal" && reason) {
      const known = (REMOVAL_REASONS as readonly string[]).includes(reason);
      rows.push({ label: t("gp.removalReason"), value: known ? v(`removalReason.${reason as "other"}`) : reason });
    }
    if (facts.event?.notes) rows.push({ label: t("gp.notes"), value: facts.event.notes });
    blocks.push({ type: "facts", rows });
  }

  if (facts.passport) {
    blocks.push({ type: "heading", text: t("gp.passportHeading") });
    blocks.push({
      type: "facts",
      rows: [
        { label: t("gp.issuedAt"), value: d.at(new Date(facts.passport.issuedAt)) },
        { label: t("gp.languages"), value: languageNames(facts.passport.languages, locale) },
      ],
    });
  }

  if (facts.device) {
    blocks.push({ type: "heading", text: t("gp.deviceHeading") });
    blocks.push({ type: "facts", rows: deviceRows(t, v, d, facts.device, { dates: false }) });
    blocks.push({ type: "heading", text: t("gp.datesHeading") });
    blocks.push({
      type: "facts",
      rows: [
        { label: t("device.plannedChange"), value: d.day(facts.device.plannedChangeOn) },
        { label: t("device.reviewDue"), value: d.day(facts.device.reviewDueOn) },
      ],
    });
  } else {
    blocks.push({ type: "notice", tone: "info", label: t("common.noticeInfo"), text: t("gp.noDevice") });
  }

  if (facts.previous && (c === "change" || c === "removal" || c === "twoc")) {
    blocks.push({ type: "heading", text: t("gp.previousHeading") });
    const prev = facts.previous;
    const rows: { label: string; value: string }[] = [
      { label: v("device.size"), value: v("device.sizeCh", { ch: prev.sizeCh }) },
      { label: v("device.balloon"), value: v("device.balloonWater", { ml: prev.balloonMl }) },
      { label: v("device.material"), value: v(`material.${prev.material}`) },
      { label: t("device.inserted"), value: t("device.insertedValue", { date: d.at(new Date(prev.insertedAt)), name: prev.insertedByName }) },
    ];
    if (c === "change" && facts.event?.reason) rows.push({ label: t("gp.changeReason"), value: v(`unplannedReason.${facts.event.reason as "blockage"}`) });
    if (c === "change" && facts.event?.kind === "planned_change") rows.push({ label: t("gp.changeReason"), value: t("gp.plannedChange") });
    blocks.push({ type: "facts", rows });
  }

  blocks.push({ type: "heading", text: t("gp.findingsHeading") });
  if (!facts.findings.length && !facts.refused.length) {
    blocks.push({ type: "paragraph", text: t("gp.noFindings") });
  }
  for (const f of facts.findings) {
    const name = findingName(t, f.code, f.message);
    blocks.push({
      type: "notice",
      tone: f.severity === "stop" ? "stop" : "warn",
      label: f.severity === "stop" ? t("common.noticeStop") : t("common.noticeWarn"),
      text: f.override ? `${name}. ${t("gp.overridden", { reason: f.override })}` : name,
    });
  }
  for (const r of facts.refused) {
    const name = findingName(t, r.code, r.code);
    blocks.push({
      type: "notice",
      tone: "info",
      label: t("common.noticeInfo"),
      text: r.detail ? t("gp.refusedDetail", { finding: name, detail: r.detail }) : t("gp.refused", { finding: name }),
    });
  }

  if (supplies) {
    blocks.push({ type: "heading", text: t("supply.itemsHeading", { days: supplies.list.days }) });
    blocks.push({
      type: "table",
      head: [t("supply.colItem"), t("supply.colQuantity")],
      rows: supplies.list.lines.filter((l) => l.quantity > 0).map((l) => [v(`supplyItem.${l.item}`), String(l.quantity)]),
    });
    blocks.push({ type: "paragraph", text: t("gp.suppliesBasis") });
  }

  // The discharge checklist as recorded: what was not done is said, not left out.
  if (facts.checklist) {
    const c = facts.checklist;
    blocks.push({ type: "heading", text: t("gp.checklist.heading") });
    blocks.push({
      type: "list",
      items: [
        ...DISCHARGE_TEACHING.map((i) => t(c.taught.includes(i) ? "gp.checklist.taught" : "gp.checklist.notTaught", { item: t(`gp.checklist.items.${i}`) })),
        c.suppliesGiven ? t("gp.checklist.supplies", { days: c.suppliesDays ?? 0 }) : t("gp.checklist.noSupplies"),
        c.drainage ? t(`gp.checklist.drainage.${c.drainage}`) : t("gp.checklist.drainage.none"),
        c.firstVisitOn ? t("gp.checklist.firstVisit", { date: d.day(c.firstVisitOn) }) : t("gp.checklist.noFirstVisit"),
        c.portalActivationGiven ? t("gp.checklist.portal") : t("gp.checklist.noPortal"),
      ],
    });
  }

  return {
    locale,
    subject: t(`gp.subject.${c}`, { hrn: facts.patient.healthRecordNumber }),
    title: t(`gp.title.${c}`),
    intro: t(`gp.intro.${c}`, { patient: facts.patient.name, actor, date: d.at(new Date(facts.occurredAt)) }),
    blocks,
    footer: [t("gp.footerWhy", { practice: facts.gp?.name ?? "" }), t("common.footerNoReply"), t("common.footerSafety")],
  };
}

/** The attachment's name tells the versions apart: its number for the patient is in it. */
export function gpSummaryFilename(facts: GpSummaryFacts) {
  const safe = facts.patient.healthRecordNumber.replace(/[^A-Za-z0-9-]+/g, "-");
  return `caddis-gp-summary-${safe}-${facts.occurredAt.slice(0, 10)}-no${facts.sequence.number}.pdf`;
}

/**
 * Queues the GP summary in the caller's transaction; one per event (a second call for the same
 * event or passport queues nothing). With no GP practice or no inbox recorded, the row is kept
 * as failed ("no_recipient") so the Letters tab and the care team's digest show it.
 */
export async function queueGpSummary(tx: Executor, input: QueueGpSummaryInput): Promise<QueuedMessage> {
  const facts = await loadGpSummaryFacts(input, tx);
  const locale = emailLocale(facts.gp?.locale);
  const content = gpSummaryContent(facts, locale, await getRegion(tx));
  const rendered = renderEmail(content);
  const params: Record<string, string> = {
    patientId: input.patientId,
    cause: input.cause,
    actorName: input.actorName,
    locale,
    ...(input.eventId ? { eventId: input.eventId } : {}),
    ...(input.passportId ? { passportId: input.passportId } : {}),
    ...(input.refused?.length ? { refused: JSON.stringify(input.refused) } : {}),
    sequence: String(facts.sequence.number),
    ...(facts.sequence.previousAt ? { previousAt: facts.sequence.previousAt } : {}),
  };
  return queueMessage(tx, {
    idempotencyKey: gpSummaryKey(input),
    kind: "gp-summary",
    to: facts.gp?.inboxEmail ?? null,
    ...rendered,
    attachments: [{ kind: "gp-summary-pdf", filename: gpSummaryFilename(facts), params }],
    patientId: input.patientId,
    organisationId: facts.gp?.id ?? null,
    locale,
    sourceId: input.eventId ?? input.passportId ?? null,
  });
}

/** Attachment renderer (lib/email/attachments.ts): the PDF, from the same rows as the e-mail. */
export async function renderGpSummaryAttachment(params: Record<string, string>) {
  const facts = await loadGpSummaryFacts(
    {
      patientId: params.patientId,
      eventId: params.eventId,
      passportId: params.passportId,
      cause: params.cause as GpSummaryCause,
      actorName: params.actorName,
      refused: params.refused ? JSON.parse(params.refused) : [],
      ...(params.sequence ? { sequence: { number: Number(params.sequence), previousAt: params.previousAt ?? null } } : {}),
    },
    db,
  );
  const { renderContentPdf } = await import("@/lib/pdf/gp-summary");
  const locale = emailLocale(params.locale);
  const region = await getRegion();
  const content = await renderContentPdf(gpSummaryContent(facts, locale, region), { generatedAt: new Date(), region });
  return { content, contentType: "application/pdf" };
}
