import "server-only";
// Referral e-mails through the outbox, in the receiving organisation's language: a new referral
// and each reminder to the receiving team; a decline (with its reason) back to the referring team.
// One message per referral and event (`referral:<event>:<referralId>[:<n>]`).
import { db, readTogether, type Executor } from "@/db";
import { getReferral, getTeamOrganisation, listOverdueReferrals, markReminded } from "@/db/queries/referrals";
import { getPatientForMail } from "@/db/queries/mail-context";
import { env } from "@/lib/config/env";
import { getReferralReminderHours, getRegion } from "@/lib/config/settings";
import { audit } from "@/lib/records/audit";
import { emailDates, emailLocale, emailTranslator } from "./i18n";
import { queueMessage, type QueuedMessage } from "./outbox";
import { renderEmail, type Block } from "./render";

export type ReferralMailEvent = "new" | "reminder" | "declined";

export async function queueReferralMail(tx: Executor, { referralId, event, reminder = 0 }: { referralId: string; event: ReferralMailEvent; reminder?: number }): Promise<QueuedMessage> {
  const referral = await getReferral({ id: referralId }, tx);
  if (!referral) throw new Error(`referral ${referralId} not found`);
  const [patient, from, to] = await readTogether(
    tx,
    () => getPatientForMail({ patientId: referral.patientId }, tx),
    () => getTeamOrganisation({ id: referral.fromOrganisationId }, tx),
    () => getTeamOrganisation({ id: referral.toOrganisationId }, tx),
  );
  if (!patient || !from || !to) throw new Error(`referral ${referralId}: patient or organisation missing`);
  const recipient = event === "declined" ? from : to;
  const locale = emailLocale(recipient.locale);
  const t = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const name = `${patient.givenName} ${patient.familyName}`;
  const origin = new URL(env.APP_URL).origin;
  const rows = [
    { label: t("gp.name"), value: name },
    { label: t("gp.healthRecordNumber"), value: patient.healthRecordNumber },
    { label: t("gp.dateOfBirth"), value: d.short(patient.dateOfBirth) },
    { label: t("referral.from"), value: from.name },
    { label: t("referral.sent"), value: d.at(referral.createdAt) },
  ];
  const blocks: Block[] =
    event === "declined"
      ? [
          { type: "notice", tone: "warn", label: t("referral.declinedLabel"), text: t("referral.declinedText", { team: to.name }) },
          { type: "heading", text: t("referral.reason") },
          { type: "paragraph", text: referral.declineReason ?? "" },
          { type: "facts", rows },
          { type: "action", href: `${origin}/${locale}/patients/${referral.patientId}/care-team`, label: t("referral.openRecord") },
        ]
      : [
          ...(event === "reminder" ? [{ type: "notice" as const, tone: "warn" as const, label: t("referral.reminderLabel"), text: t("referral.reminderText", { date: d.at(referral.createdAt) }) }] : []),
          { type: "facts", rows },
          { type: "heading", text: t("referral.handover") },
          { type: "paragraph", text: referral.handoverNote },
          { type: "action", href: `${origin}/${locale}/caseload`, label: t("referral.open") },
        ];
  return queueMessage(tx, {
    idempotencyKey: event === "reminder" ? `referral:reminder:${referral.id}:${reminder}` : `referral:${event}:${referral.id}`,
    kind: `referral-${event}`,
    to: recipient.inboxEmail,
    ...renderEmail({
      locale,
      subject: t(`referral.subject.${event}`, { hrn: patient.healthRecordNumber, team: event === "declined" ? to.name : from.name }),
      title: t(`referral.title.${event}`),
      intro: t(`referral.intro.${event}`, { patient: name, team: event === "declined" ? to.name : from.name }),
      blocks,
      footer: [t("common.footerNoReply"), t("common.footerSafety")],
    }),
    patientId: referral.patientId,
    organisationId: recipient.id,
    locale,
    sourceId: referral.id,
  });
}

/**
 * The scheduled sweep: every referral unanswered for longer than the reminder time (Settings,
 * default 24 h) is sent again to the receiving team and counted, each in its own transaction.
 * Its referrer's caseload flags it from the same time.
 */
export async function sendReferralReminders({ now = new Date() }: { now?: Date } = {}) {
  const hours = await getReferralReminderHours();
  const due = await listOverdueReferrals({ hours, now });
  let sent = 0;
  for (const r of due) {
    await db.transaction(async (tx) => {
      if (!(await markReminded({ ...r, now }, tx))) return;
      await queueReferralMail(tx, { referralId: r.id, event: "reminder", reminder: r.reminders + 1 });
      await audit({ action: "referral.remind", patientId: r.patientId, details: { referralId: r.id, reminder: r.reminders + 1, hours } }, tx);
      sent++;
    });
  }
  return { sent };
}
