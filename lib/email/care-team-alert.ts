import "server-only";
// Urgent and emergency check-ins, and medium or high NEWS2, e-mail every care-team organisation
// of the patient at once (in each organisation's language). Called inside the transaction that
// stores the check-in or the observations, so the alert exists exactly when they do.
import { readTogether, type Executor } from "@/db";
import type { AlertReporter } from "@/db/schema";
import { getLeadTeamContact, type LeadTeamContact } from "@/db/queries/contacts";
import { getActiveEpisode, getPatientForMail } from "@/db/queries/mail-context";
import { alertTeams } from "@/lib/records/alert-team";
import { getRegion } from "@/lib/config/settings";
import { env } from "@/lib/config/env";
import { emailDates, emailLocale, emailTranslator, emailVocabulary } from "./i18n";
import { queueMessage, type QueuedMessage } from "./outbox";
import { renderEmail, type Block, type EmailContent } from "./render";

export type CareTeamAlertKind = "check-in" | "news2" | "twoc-overdue";
export type CareTeamAlertInput = {
  patientId: string;
  kind: CareTeamAlertKind;
  /** check-in: "emergency" | "urgent" (lower levels send nothing); NEWS2: "high" | "medium". */
  level: string;
  /** What was reported, in plain words (may hold patient-entered text: it is escaped). */
  summary: string;
  /** The check-in or observation id: one alert per source and organisation. */
  sourceId: string;
  /** For NEWS2: the total score, shown in the alert. */
  score?: number;
  reporter?: AlertReporter;
  /** The reporter's own notes (the visit's notes), escaped like the summary. */
  notes?: string | null;
  /** Sent again because nobody acknowledged it: when it was first raised. */
  reminderOf?: Date;
  /** A trial without catheter past its window: when the catheter came out and the void was expected. */
  trial?: { removedAt: Date; voidBy: Date };
};

export const ALERT_LEVELS: Record<CareTeamAlertKind, readonly string[]> = {
  "check-in": ["emergency", "urgent"],
  // Low-medium (a single parameter scoring 3) alerts too: RCP NEWS2 (2017) chart 4 has the
  // medical team informed and reviewing, and a visiting clinician may leave before anyone reads
  // the screen.
  news2: ["high", "medium", "low-medium"],
  // A trial without catheter whose window passed with no outcome: the patient may be in retention.
  "twoc-overdue": ["overdue"],
};

export function isAlertLevel(kind: CareTeamAlertKind, level: string) {
  return ALERT_LEVELS[kind].includes(level);
}

type AlertLevel = "emergency" | "urgent" | "high" | "medium" | "low-medium" | "overdue";

function reporterLine(t: ReturnType<typeof emailTranslator>, r: AlertReporter | undefined): string | null {
  if (!r) return null;
  if (r.kind === "patient") return t("alert.reporter.patient");
  if (r.kind === "carer") return t("alert.reporter.carer", { name: r.name });
  return t("alert.reporter.clinician", { details: [r.name, r.organisation, r.phone].filter(Boolean).join(", ") });
}

// The least identity the team needs: the health record number and a link that asks them to sign
// in; never the patient's name, date of birth or phone number in an ordinary e-mail.
function alertContent(
  input: CareTeamAlertInput & { level: AlertLevel },
  ctx: { hrn: string; device: string | null; plannedChangeOn: string | null; teamName: string; lead: LeadTeamContact | null },
  locale: string,
  region: string | null,
): EmailContent {
  const t = emailTranslator(locale);
  const d = emailDates(locale, region);
  const levelWord = t(`enum.alertLevel.${input.level}`);
  const severe = input.level === "emergency" || input.level === "high";
  const rows = [{ label: t("gp.healthRecordNumber"), value: ctx.hrn }];
  if (ctx.device) rows.push({ label: t("alert.device"), value: ctx.device });
  if (ctx.plannedChangeOn) rows.push({ label: t("device.plannedChange"), value: d.day(ctx.plannedChangeOn) });
  if (input.kind === "news2" && typeof input.score === "number") rows.push({ label: t("alert.score"), value: String(input.score) });
  if (input.trial) {
    rows.push({ label: t("alert.twocRemovedAt"), value: d.at(input.trial.removedAt) });
    rows.push({ label: t("alert.twocVoidBy"), value: d.at(input.trial.voidBy) });
  }
  const reporter = reporterLine(t, input.reporter);
  // The lead team and its numbers: who the patient was told to call (getLeadTeamContact).
  if (ctx.lead) {
    const day = ctx.lead.phone ? t("common.teamLine", { name: ctx.lead.name, phone: ctx.lead.phone }) : ctx.lead.name;
    rows.push({ label: t("alert.leadTeam"), value: ctx.lead.outOfHoursPhone ? `${day} ${t("common.outOfHours", { phone: ctx.lead.outOfHoursPhone })}` : day });
  }
  const blocks: Block[] = [
    { type: "notice", tone: severe ? "stop" : "warn", label: levelWord, text: t(`alert.action.${input.level}`) },
    ...(input.reminderOf ? [{ type: "paragraph" as const, text: t("alert.reminderIntro", { date: d.at(input.reminderOf) }) }] : []),
    ...(reporter ? [{ type: "heading" as const, text: t("alert.reportedBy") }, { type: "paragraph" as const, text: reporter }] : []),
    { type: "heading", text: t("alert.reported") },
    { type: "paragraph", text: input.trial ? t("alert.twocSummary") : input.summary },
    ...(input.notes ? [{ type: "heading" as const, text: t("alert.notes") }, { type: "paragraph" as const, text: input.notes }] : []),
    { type: "heading", text: t("gp.patient") },
    { type: "facts", rows },
    { type: "action", href: `${new URL(env.APP_URL).origin}/${locale}/patients/${input.patientId}`, label: t("alert.open") },
    { type: "paragraph", text: t("alert.signIn") },
    { type: "paragraph", text: input.trial ? t("alert.twocRecord") : t("alert.acknowledge") },
  ];
  const subject = t(`alert.subject.${input.kind}`, { level: levelWord, hrn: ctx.hrn });
  return {
    locale,
    subject: input.reminderOf ? t("alert.reminderSubject", { subject }) : subject,
    title: t(`alert.title.${input.kind}`, { level: levelWord }),
    intro: t(`alert.intro.${input.kind}`, { date: d.at(input.reminderOf ?? new Date()) }),
    blocks,
    footer: [t("alert.footerWhy", { team: ctx.teamName }), t("common.footerNoReply"), t("common.footerSafety")],
  };
}

/**
 * Queues one alert per care-team organisation (key `care-team-alert:<kind>:<sourceId>:<orgId>`).
 * Returns nothing for levels that do not alert, so callers may call it for every check-in.
 * A team with no inbox recorded gets a row kept as failed ("no_recipient"), visible on the
 * Letters tab.
 */
export async function queueCareTeamAlert(tx: Executor, input: CareTeamAlertInput): Promise<QueuedMessage[]> {
  if (!isAlertLevel(input.kind, input.level)) return [];
  const patient = await getPatientForMail({ patientId: input.patientId }, tx);
  if (!patient) throw new Error(`care-team alert: patient ${input.patientId} not found`);
  const [teams, episode, lead] = await readTogether(
    tx,
    () => alertTeams({ patientId: input.patientId }, tx),
    () => getActiveEpisode({ patientId: input.patientId }, tx),
    () => getLeadTeamContact({ patientId: input.patientId }, tx),
  );
  const region = await getRegion(tx);
  const out: QueuedMessage[] = [];
  // No care team at all: keep a failed row so the gap is visible rather than silent.
  const targets = teams.length
    ? teams
    : [{ id: "none", name: "", kind: "community_team", inboxEmail: null, locale: "en", phone: null, outOfHoursPhone: null }];
  for (const team of targets) {
    const locale = emailLocale(team.locale);
    const t = emailTranslator(locale);
    const device = episode
      ? t("alert.deviceValue", { route: emailVocabulary(locale)(`route.${episode.route}`), ch: episode.sizeCh, ml: episode.balloonMl })
      : null;
    const content = alertContent(
      { ...input, level: input.level as AlertLevel },
      {
        hrn: patient.healthRecordNumber,
        device,
        plannedChangeOn: episode?.plannedChangeOn ?? null,
        teamName: team.name,
        lead,
      },
      locale,
      region,
    );
    out.push(
      await queueMessage(tx, {
        idempotencyKey: `care-team-alert:${input.kind}:${input.sourceId}:${team.id}${input.reminderOf ? ":reminder" : ""}`,
        kind: "care-team-alert",
        to: team.inboxEmail,
        ...renderEmail(content),
        patientId: input.patientId,
        organisationId: team.id === "none" ? null : team.id,
        locale,
        sourceId: input.sourceId,
      }),
    );
  }
  return out;
}
