// Patients with a portal account get one e-mail, in their language, when their catheter change is
// near (or passed without a change recorded); re-running the daily job sends nothing more.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { outboundMessages, patients, user } from "@/db/schema";
import { addDays } from "@/lib/clinical";
import { localToday } from "@/lib/email/digest";
import { queueChangeReminders, REMINDER_DAYS_BEFORE } from "@/lib/email/patient-reminders";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { insertEpisode, mailPatient, waitForEmails, type MailFixture } from "../support/mail";

const quiet = () => {};
const today = localToday();
let soon: MailFixture;
let later: MailFixture;
let noAccount: MailFixture;
const emails: Record<string, string> = {};

async function giveAccount(fx: MailFixture, locale: string) {
  const id = randomUUID();
  const email = `reminder.${fx.tag}@mail-test.example`;
  await db.insert(user).values({ id, name: "Reminder Test", email, role: "patient", locale });
  await db.update(patients).set({ userId: id, preferredLocale: locale }).where(eq(patients.id, fx.patientId));
  emails[fx.patientId] = email;
  return id;
}

// The reminder window (3 days before, up to 7 days overdue) is our own choice: common practice,
// no source. The planned dates themselves come from lib/clinical planDates, tested with sources.
beforeAll(async () => {
  soon = await mailPatient({ givenName: "Lucía", familyName: "Reminder-Test" });
  later = await mailPatient({ givenName: "Tomasz", familyName: "Reminder-Later" });
  noAccount = await mailPatient({ givenName: "Ines", familyName: "Reminder-None" });
  await giveAccount(soon, "es");
  await giveAccount(later, "pl");
  await insertEpisode(soon.patientId, { plannedChangeOn: addDays(today, 2) });
  await insertEpisode(later.patientId, { plannedChangeOn: addDays(today, REMINDER_DAYS_BEFORE + 5) });
  await insertEpisode(noAccount.patientId, { plannedChangeOn: addDays(today, 1) });
});
afterAll(async () => {
  for (const fx of [soon, later, noAccount]) await fx?.cleanup();
  await db.delete(user).where(eq(user.email, emails[soon.patientId]));
  await db.delete(user).where(eq(user.email, emails[later.patientId]));
});

const remindersFor = (patientId: string) =>
  db.select().from(outboundMessages).where(and(eq(outboundMessages.patientId, patientId), eq(outboundMessages.kind, "change-reminder")));

describe("catheter change reminders", () => {
  it("reach a patient whose change is due within the window, in their language, once", async () => {
    await queueChangeReminders({ today });
    const [msg, ...more] = await remindersFor(soon.patientId);
    expect(more).toHaveLength(0);
    expect(msg).toMatchObject({ toAddress: emails[soon.patientId], locale: "es", status: "queued" });
    expect(msg.subject).toMatch(/^El cambio de su sonda es el /);
    expect(msg.text).toContain("dentro de 2 días");
    // The lead team's name and phone are in it (getLeadTeamContact: the fixture's team leads).
    expect(msg.text).toContain(`Test Team ${soon.tag}`);
    expect(msg.text).toContain("01632 960 778");

    // The job runs every day and on every instance: nothing more for the same planned date.
    await queueChangeReminders({ today });
    await queueChangeReminders({ today: addDays(today, 1) });
    expect(await remindersFor(soon.patientId)).toHaveLength(1);

    await drainOutbox({ keyPrefix: `change-reminder:`, log: quiet });
    const [mail] = await waitForEmails(emails[soon.patientId], 1);
    expect(mail.subject).toBe(msg.subject);
  });

  it("wait while the change is further off, and never go to a patient without an account", async () => {
    expect(await remindersFor(later.patientId)).toHaveLength(0);
    expect(await remindersFor(noAccount.patientId)).toHaveLength(0);
    // Five days before the change: now it goes, in Polish.
    await queueChangeReminders({ today: addDays(today, 5) });
    const [msg] = await remindersFor(later.patientId);
    expect(msg).toMatchObject({ locale: "pl" });
    expect(msg.text).toContain("za 3 dni");
  });

  it("tell a patient whose change date has passed that no change is recorded", async () => {
    await db.delete(outboundMessages).where(eq(outboundMessages.patientId, soon.patientId));
    await queueChangeReminders({ today: addDays(today, 4) });
    const [msg] = await remindersFor(soon.patientId);
    expect(msg.subject).toBe("El cambio de su sonda está atrasado");
    expect(msg.text).toContain("No tenemos constancia");
  });
});
