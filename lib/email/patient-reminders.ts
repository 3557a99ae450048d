import "server-only";
// A reminder to the patient, in their language, that their catheter change is near or has
// passed without a change being recorded: a daily pg-boss schedule. One e-mail per catheter and
// planned date (key `change-reminder:<episodeId>:<date>`), so a re-run or a second instance
// sends nothing more, and a new planned date after a change gets its own reminder.
import { db, type Executor } from "@/db";
import { getLeadTeamContact } from "@/db/queries/contacts";
import { listChangeReminders } from "@/db/queries/reminders";
import { addDays, parseIsoDate } from "@/lib/clinical";
import { env } from "@/lib/config/env";
import { getPlanDefaults, getRegion } from "@/lib/config/settings";
import { localToday } from "./digest";
import { emailDates, emailLocale, emailTranslator } from "./i18n";
import { queueMessage, type QueuedMessage } from "./outbox";
import { renderEmail, type Block } from "./render";

/**
 * Days before the planned change that the reminder goes (common practice, no source), never
 * earlier than the care team's own due-soon window in Settings.
 */
export const REMINDER_DAYS_BEFORE = 3;
/** A change overdue by longer than this is the care team's to chase (their digest lists it). */
export const REMINDER_OVERDUE_DAYS = 7;

type ReminderRow = Awaited<ReturnType<typeof listChangeReminders>>[number];

export async function queueChangeReminder(tx: Executor, row: ReminderRow, today: string): Promise<QueuedMessage> {
  const locale = emailLocale(row.preferredLocale);
  const t = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const days = parseIsoDate("plannedChangeOn", row.plannedChangeOn) - parseIsoDate("today", today);
  const lead = await getLeadTeamContact({ patientId: row.patientId }, tx);
  const team = lead?.phone ? { name: lead.name, phone: lead.phone } : null;
  const blocks: Block[] = [
    { type: "paragraph", text: days < 0 ? t("reminder.overdue", { date: d.day(row.plannedChangeOn) }) : t("reminder.due", { date: d.day(row.plannedChangeOn), days }) },
    { type: "paragraph", text: team ? t("reminder.callTeam", { team: team.name, phone: team.phone }) : t("reminder.callTeamNoPhone") },
    { type: "paragraph", text: t("reminder.meanwhile") },
    { type: "action", href: `${new URL(env.APP_URL).origin}/${locale}/today`, label: t("reminder.open") },
  ];
  return queueMessage(tx, {
    idempotencyKey: `change-reminder:${row.episodeId}:${row.plannedChangeOn}`,
    kind: "change-reminder",
    to: row.email,
    ...renderEmail({
      locale,
      subject: days < 0 ? t("reminder.subjectOverdue") : t("reminder.subject", { date: d.short(row.plannedChangeOn) }),
      title: t("reminder.title"),
      intro: t("reminder.intro", { name: row.givenName }),
      blocks,
      footer: [t("patient.footerHelp"), t("patient.footerNoReply")],
    }),
    patientId: row.patientId,
    locale,
    sourceId: row.episodeId,
  });
}

/** The scheduled job: every reminder due today, each in its own transaction. */
export async function queueChangeReminders({ today = localToday() }: { today?: string } = {}) {
  const { dueSoonDays } = await getPlanDefaults();
  const ahead = Math.min(REMINDER_DAYS_BEFORE, dueSoonDays);
  const rows = await listChangeReminders({ from: addDays(today, -REMINDER_OVERDUE_DAYS), until: addDays(today, ahead) });
  let queued = 0;
  for (const row of rows) {
    const r = await db.transaction((tx) => queueChangeReminder(tx, row, today));
    if (r.created) queued++;
  }
  return { patients: rows.length, queued };
}
