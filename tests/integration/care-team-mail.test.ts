// Care-team alerts (urgent/emergency check-ins, medium/high NEWS2) reach every care-team inbox at
// once; the weekly digest lists changes and reviews due in 7 days and overdue, and failed mail;
// pg-boss holds the weekly schedule.
import { randomUUID } from "node:crypto";
import { eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { careTeam, outboundMessages } from "@/db/schema";
import { queueCareTeamAlert } from "@/lib/email/care-team-alert";
import { localToday, queueDigestFor, queueWeeklyDigests } from "@/lib/email/digest";
import { queueMessage } from "@/lib/email/outbox";
import { QUEUES } from "@/lib/jobs/boss";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { startBackground } from "@/lib/jobs/runtime";
import { insertEpisode, mailPatient, waitForEmails, type MailFixture } from "../support/mail";

const quiet = () => {};
let fx: MailFixture;

beforeAll(async () => {
  fx = await mailPatient({ givenName: "Winifred", familyName: "Alert-Test" });
});
afterAll(async () => {
  await fx?.cleanup();
});

const iso = (days: number, from = new Date()) => new Date(from.getTime() + days * 86_400_000).toISOString().slice(0, 10);

describe("care-team alerts", () => {
  it("an emergency check-in e-mails the lead team at once (not every care-team organisation), with what was reported escaped", async () => {
    await insertEpisode(fx.patientId);
    const sourceId = randomUUID();
    const summary = `Shivering and confused; no urine for 12 hours. Patient wrote: <script>alert(1)</script>`;
    const queued = await db.transaction((tx) => queueCareTeamAlert(tx, { patientId: fx.patientId, kind: "check-in", level: "emergency", summary, sourceId }));
    // The fixture's team leads; Harbourside is on the care team too but is not told (alertTeams).
    expect(queued).toHaveLength(1);
    const rows = await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `care-team-alert:check-in:${sourceId}:%`));
    expect(rows.map((r) => r.toAddress)).toEqual([fx.teamInbox]);
    await drainOutbox({ keyPrefix: `care-team-alert:check-in:${sourceId}:`, log: quiet });
    const [mail] = await waitForEmails(fx.teamInbox, 1);
    expect(mail.subject).toBe(`Caddis Emergency: check-in from patient ${fx.hrn}`);
    // Least identity: the record number and a link that asks for sign-in, never the name or birth date.
    expect(mail.text).toContain(fx.hrn);
    expect(`${mail.subject} ${mail.text} ${mail.html}`).not.toMatch(/Winifred|Alert-Test|1948/);
    expect(mail.text).toContain(summary);
    expect(mail.text).toContain("The patient was told to call the emergency number now.");
    expect(mail.text).toMatch(/\/en\/patients\/[0-9a-f-]{36}/);
    expect(mail.html).not.toContain("<script>");
    expect(mail.html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
  });

  it("one alert per source: calling twice for the same check-in queues nothing more", async () => {
    const sourceId = randomUUID();
    const input = { patientId: fx.patientId, kind: "check-in" as const, level: "urgent", summary: "Bypassing since this morning", sourceId };
    const a = await db.transaction((tx) => queueCareTeamAlert(tx, input));
    const b = await db.transaction((tx) => queueCareTeamAlert(tx, input));
    expect(a.every((m) => m.created)).toBe(true);
    expect(b.map((m) => [m.id, m.created])).toEqual(a.map((m) => [m.id, false]));
  });

  it("NEWS2 low-medium, medium and high alert; low and the lower check-in levels do not", async () => {
    const tx = db;
    for (const level of ["soon", "self-care"]) {
      expect(await queueCareTeamAlert(tx, { patientId: fx.patientId, kind: "check-in", level, summary: "x", sourceId: randomUUID() })).toEqual([]);
    }
    expect(await queueCareTeamAlert(tx, { patientId: fx.patientId, kind: "news2", level: "low", summary: "x", sourceId: randomUUID() })).toEqual([]);
    // Source: RCP NEWS2 (2017) chart 4: a 3 in any single parameter → the medical team is informed and reviews.
    const lowMedium = await db.transaction((t) =>
      queueCareTeamAlert(t, { patientId: fx.patientId, kind: "news2", level: "low-medium", score: 3, summary: "RR 8", sourceId: randomUUID() }),
    );
    expect(lowMedium).toHaveLength(1);
    const medium = await db.transaction((t) =>
      queueCareTeamAlert(t, { patientId: fx.patientId, kind: "news2", level: "medium", score: 5, summary: "RR 22, pulse 112", sourceId: randomUUID() }),
    );
    expect(medium).toHaveLength(1);
    const sourceId = randomUUID();
    const high = await db.transaction((t) =>
      queueCareTeamAlert(t, { patientId: fx.patientId, kind: "news2", level: "high", score: 8, summary: "RR 26, SpO2 91 %, SBP 88 mmHg, new confusion", sourceId }),
    );
    expect(high).toHaveLength(1);
    await drainOutbox({ keyPrefix: `care-team-alert:news2:${sourceId}:`, log: quiet });
    const mails = await waitForEmails(fx.teamInbox, 2);
    const mail = mails.find((m) => m.subject.includes("NEWS2"))!;
    expect(mail.subject).toBe(`Caddis NEWS2 High: patient ${fx.hrn}`);
    expect(mail.text).toContain("NEWS2 total: 8");
    expect(mail.text).toContain("Emergency assessment by a team with critical-care skills is advised.");
  });

  it("in each organisation's language", async () => {
    const pl = await mailPatient({ teamLocale: "pl" });
    try {
      const sourceId = randomUUID();
      await db.transaction((tx) => queueCareTeamAlert(tx, { patientId: pl.patientId, kind: "check-in", level: "urgent", summary: "Ból brzucha", sourceId }));
      await drainOutbox({ keyPrefix: `care-team-alert:check-in:${sourceId}:`, log: quiet });
      const [mail] = await waitForEmails(pl.teamInbox, 1);
      expect(mail.subject).toBe(`Caddis Pilne dzisiaj: zgłoszenie od pacjenta ${pl.hrn}`);
      expect(mail.html).toContain('lang="pl"');
    } finally {
      await pl.cleanup();
    }
  });
});

describe("weekly digest", () => {
  it("lists the team's changes and reviews due in the next 7 days and overdue, and mail that failed", async () => {
    const team = await mailPatient({ givenName: "Dora", familyName: "Digest-Due" });
    const late = await mailPatient({ givenName: "Ernest", familyName: "Digest-Late" });
    try {
      // Dora and Ernest share Dora's team; Ernest's review is overdue, Dora's change is due.
      await db.insert(careTeam).values({ patientId: late.patientId, organisationId: team.teamId });
      const today = localToday();
      await insertEpisode(team.patientId, { plannedChangeOn: iso(3, new Date(`${today}T12:00:00Z`)), reviewDueOn: iso(20, new Date(`${today}T12:00:00Z`)) });
      await insertEpisode(late.patientId, { plannedChangeOn: iso(40, new Date(`${today}T12:00:00Z`)), reviewDueOn: iso(-2, new Date(`${today}T12:00:00Z`)) });
      await db.transaction((tx) =>
        queueMessage(tx, { idempotencyKey: `test:${late.tag}:lost`, kind: "gp-summary", to: null, subject: "Lost summary", html: "", text: "", patientId: late.patientId }),
      );
      const organisation = { id: team.teamId, name: `Test Team ${team.tag}`, inboxEmail: team.teamInbox, locale: "en" };
      const first = await db.transaction((tx) => queueDigestFor(tx, { organisation, today }));
      const again = await db.transaction((tx) => queueDigestFor(tx, { organisation, today }));
      expect(first.created).toBe(true);
      expect(again).toMatchObject({ id: first.id, created: false });
      await drainOutbox({ keyPrefix: `digest:${team.teamId}:`, log: quiet });
      const [mail] = await waitForEmails(team.teamInbox, 1);
      expect(mail.subject).toBe(`Caddis week ahead, Test Team ${team.tag}: 1 overdue, 1 due`);
      const text = mail.text!;
      const overdue = text.slice(text.indexOf("Overdue"), text.indexOf("Due in the next 7 days"));
      const due = text.slice(text.indexOf("Due in the next 7 days"), text.indexOf("Messages not delivered"));
      expect(overdue).toContain(`Ernest Digest-Late | ${late.hrn} | Review of need`);
      expect(overdue).toContain("2 days overdue");
      expect(due).toContain(`Dora Digest-Due | ${team.hrn} | Planned change`);
      expect(due).toContain("in 3 days");
      expect(text).toContain("Lost summary | No e-mail address is recorded for the receiving organisation.");
      expect(text).not.toContain("Winifred"); // not this team's patient
    } finally {
      await team.cleanup();
      await late.cleanup();
    }
  });

  it("queueWeeklyDigests covers every care team with an inbox, once a day", async () => {
    const today = localToday();
    const r1 = await queueWeeklyDigests({ today, organisationIds: [fx.teamId] });
    const r2 = await queueWeeklyDigests({ today, organisationIds: [fx.teamId] });
    expect(r1).toEqual({ organisations: 1, queued: 1 });
    expect(r2).toEqual({ organisations: 1, queued: 0 });
  });

  it("is scheduled with pg-boss (Monday 07:00, the deployment's time zone), and the job queues the digests", { timeout: 60_000 }, async () => {
    const bg = await startBackground({ outbox: false, schedules: true, worker: { log: quiet } });
    try {
      expect(bg.boss).toBeTruthy();
      const schedules = (await bg.boss!.getSchedules()).filter((s) => s.name === QUEUES.digest);
      expect(schedules).toHaveLength(1);
      expect(schedules[0]).toMatchObject({ cron: "0 7 * * 1", timezone: "Europe/London" });
      expect((await bg.boss!.getSchedules()).filter((s) => s.name === QUEUES.sweep)).toHaveLength(1);
      // The patients' change reminders (lib/email/patient-reminders.ts): daily at 09:00.
      expect((await bg.boss!.getSchedules()).filter((s) => s.name === QUEUES.reminders)).toMatchObject([{ cron: "0 9 * * *", timezone: "Europe/London" }]);
      // Run the job now rather than wait for Monday.
      await db.delete(outboundMessages).where(eq(outboundMessages.idempotencyKey, `digest:${fx.teamId}:${localToday()}`));
      await bg.boss!.send(QUEUES.digest, {});
      let found = false;
      for (let i = 0; i < 100 && !found; i++) {
        await new Promise((r) => setTimeout(r, 200));
        found = (await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, `digest:${fx.teamId}:${localToday()}`))).length === 1;
      }
      expect(found).toBe(true);
    } finally {
      await bg.stop();
    }
  });
});
