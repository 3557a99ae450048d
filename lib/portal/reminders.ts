import "server-only";
// The reminders a patient chose (More → Reminders): bag, valve and catheter change, drinks, a
// weekly check-in, each by push, text or e-mail, in the patient's language. A pg-boss schedule
// (`portal-reminders`, every 5 minutes) queues the due ones into the outbox; the key
// `reminder:<userId>:<kind>:<day>T<time>` makes a re-run, or a second instance, send nothing more.
// With no catheter in place the device reminders stop; a closed record gets none.
import { db } from "@/db";
import { listReminderPeople } from "@/db/queries/portal-reminders";
import { addDays } from "@/lib/clinical";
import { env } from "@/lib/config/env";
import { emailLocale } from "@/lib/email/i18n";
import { queueMessage, queuePush, queueText } from "@/lib/email/outbox";
import { renderEmail } from "@/lib/email/render";
import { REMINDER_DAYS_BEFORE, REMINDER_OVERDUE_DAYS } from "@/lib/email/patient-reminders";
import { translatorFor } from "@/lib/i18n/catalogues";
import { dueOccurrences } from "@/lib/shared/reminder-schedule";
import { dayIn } from "@/lib/shared/time-zone";
import { DEVICE_REMINDERS, REMINDER_KINDS, WEEKLY_REMINDERS, type ReminderKind } from "@/lib/validations/reach";

/** The page each reminder opens. */
const PAGE: Record<ReminderKind, string> = { bag: "/today", valve: "/today", change: "/my-catheter", drinks: "/diary", checkIn: "/check-in" };

type Person = Awaited<ReturnType<typeof listReminderPeople>>[number];

function applies(kind: ReminderKind, p: Person, today: string): boolean {
  if (DEVICE_REMINDERS.includes(kind) && !p.episodeId) return false;
  if (kind === "change") {
    // Like the change e-mail: from a few days before the planned date to a week after it.
    if (!p.plannedChangeOn) return false;
    return p.plannedChangeOn >= addDays(today, -REMINDER_OVERDUE_DAYS) && p.plannedChangeOn <= addDays(today, REMINDER_DAYS_BEFORE);
  }
  return true;
}

/** Queues every reminder due now; returns how many rows were written. */
export async function queueDueReminders({ now = new Date(), timeZone = env.CADDIS_TIME_ZONE }: { now?: Date; timeZone?: string } = {}) {
  const today = dayIn(now, timeZone);
  const people = await listReminderPeople();
  let queued = 0;
  for (const p of people) {
    const locale = emailLocale(p.preferredLocale);
    const t = translatorFor(locale, "Reminders");
    for (const kind of REMINDER_KINDS) {
      const choice = p.reminders[kind];
      if (!choice?.on || !applies(kind, p, today)) continue;
      const due = dueOccurrences({ choice, weekly: WEEKLY_REMINDERS.includes(kind), quietStart: p.quietStart, quietEnd: p.quietEnd, now, timeZone, today })
        // A reminder chosen after its time starts with the next one.
        .filter((o) => o.dueAt >= p.updatedAt);
      for (const o of due) {
        const key = `reminder:${p.userId}:${kind}:${o.slot}`;
        const title = t(`sent.${kind}.title`);
        const body = t(`sent.${kind}.body`);
        const link = `/${locale}${PAGE[kind]}`;
        await db.transaction(async (tx) => {
          if (choice.channel === "push") {
            for (const r of await queuePush(tx, { idempotencyKey: key, kind: "reminder", userId: p.userId, title, body, link, patientId: p.patientId, locale })) if (r.created) queued++;
          } else if (choice.channel === "sms") {
            // No number or no consent (withdrawn since): kept as failed, never sent.
            const to = p.smsConsentAt ? p.phone : null;
            if ((await queueText(tx, { idempotencyKey: key, kind: "reminder", to, text: `${title}: ${body}`, patientId: p.patientId, locale })).created) queued++;
          } else {
            const mail = renderEmail({
              locale,
              subject: title,
              title,
              intro: body,
              blocks: [{ type: "action", href: `${new URL(env.APP_URL).origin}${link}`, label: t("sent.open") }],
              footer: [t("sent.footer")],
            });
            if ((await queueMessage(tx, { idempotencyKey: key, kind: "reminder", to: p.email, ...mail, patientId: p.patientId, locale })).created) queued++;
          }
        });
      }
    }
  }
  return { people: people.length, queued };
}
