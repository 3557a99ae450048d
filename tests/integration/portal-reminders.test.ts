// The reminders a patient chooses (lib/portal/reminders.ts): queued into the outbox at their time,
// in the patient's language, once per time; held to the end of quiet hours; device reminders stop
// while no catheter is in place. The text reaches the SMS service through its SDK.
import { and, eq, isNull, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { setReach, type ReachDto } from "@/db/queries/reach";
import { catheterEpisodes, outboundMessages, patients } from "@/db/schema";
import type { MailTransport } from "@/lib/email/transport";
import { translatorFor } from "@/lib/i18n/catalogues";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { queueDueReminders } from "@/lib/portal/reminders";
import { createSmsSender } from "@/lib/sms/client";
import { startFakeSms } from "@/scripts/fake-sms";
import { userIdByEmail } from "../support/fixtures";
import { demo } from "../support/http";
import { freePort } from "../support/mail";

const tz = "Europe/London";
const noMail = { sendMail: async () => { throw new Error("no e-mail expected"); }, close: () => {} } as unknown as MailTransport;
let sms: Awaited<ReturnType<typeof startFakeSms>>;
let port: number;
beforeAll(async () => {
  port = await freePort();
  sms = await startFakeSms({ port });
});
afterAll(() => sms?.close());

const rows = (userId: string) => db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `reminder:${userId}:%`));
const deliver = (userId: string) => drainOutbox({ transport: noMail, sms: createSmsSender({ apiUrl: `http://127.0.0.1:${port}` }), keyPrefix: `reminder:${userId}:`, log: () => {} });
const reach = (reminders: ReachDto["reminders"], phone = "+447700900111") => ({ phone, smsConsent: true, quietStart: "22:00", quietEnd: "07:00", reminders });

describe("chosen reminders", () => {
  it("a bag reminder by text is queued at its time on its day, once, and reaches the SMS service", async () => {
    const userId = await userIdByEmail(demo.patient.email);
    // Thursday 10 December 2026 (weekday 4), 08:30 in London (GMT).
    await setReach({ userId, reach: reach({ bag: { on: true, times: ["08:30"], day: 4, channel: "sms" } }) });
    expect((await queueDueReminders({ now: new Date("2026-12-10T08:29:00Z"), timeZone: tz })).queued).toBe(0);
    expect((await queueDueReminders({ now: new Date("2026-12-10T08:31:00Z"), timeZone: tz })).queued).toBe(1);
    expect((await queueDueReminders({ now: new Date("2026-12-10T08:36:00Z"), timeZone: tz })).queued).toBe(0);
    // Not on another day of the week.
    expect((await queueDueReminders({ now: new Date("2026-12-11T08:31:00Z"), timeZone: tz })).queued).toBe(0);
    const [row] = await rows(userId);
    expect(row).toMatchObject({ idempotencyKey: `reminder:${userId}:bag:2026-12-10T08:30`, channel: "sms", toAddress: "+447700900111", kind: "reminder" });
    expect((await deliver(userId)).sent).toBe(1);
    const t = translatorFor("en", "Reminders");
    expect(sms.messages.filter((m) => m.to === "447700900111").map((m) => m.text)).toEqual([`${t("sent.bag.title")}: ${t("sent.bag.body")}`]);
  });

  it("a reminder due in quiet hours waits to their end", async () => {
    const userId = await userIdByEmail(demo.patient.email);
    await setReach({ userId, reach: reach({ drinks: { on: true, times: ["23:00"], channel: "sms" } }) });
    expect((await queueDueReminders({ now: new Date("2026-12-10T23:05:00Z"), timeZone: tz })).queued).toBe(0);
    expect((await queueDueReminders({ now: new Date("2026-12-11T06:59:00Z"), timeZone: tz })).queued).toBe(0);
    expect((await queueDueReminders({ now: new Date("2026-12-11T07:02:00Z"), timeZone: tz })).queued).toBe(1);
    const keys = (await rows(userId)).map((r) => r.idempotencyKey);
    expect(keys).toContain(`reminder:${userId}:drinks:2026-12-10T23:00`);
  });

  it("is written in the patient's language (Arabic)", async () => {
    const userId = await userIdByEmail(demo.patientAr.email);
    await setReach({ userId, reach: reach({ drinks: { on: true, times: ["12:00"], channel: "sms" } }, "+447700900222") });
    expect((await queueDueReminders({ now: new Date("2026-12-10T12:01:00Z"), timeZone: tz })).queued).toBe(1);
    const [row] = await rows(userId);
    const t = translatorFor("ar", "Reminders");
    expect(row.text).toBe(`${t("sent.drinks.title")}: ${t("sent.drinks.body")}`);
    expect(row.locale).toBe("ar");
  });

  it("with no catheter in place, bag, valve and change reminders stop; drinks go on", async () => {
    const userId = await userIdByEmail(demo.patient.email);
    const [p] = await db.select({ id: patients.id }).from(patients).where(eq(patients.userId, userId));
    await db.update(catheterEpisodes).set({ removedAt: new Date("2026-12-01T10:00:00Z") }).where(and(eq(catheterEpisodes.patientId, p.id), isNull(catheterEpisodes.removedAt)));
    await setReach({
      userId,
      reach: reach({ bag: { on: true, times: ["09:00"], day: 4, channel: "sms" }, valve: { on: true, times: ["09:00"], day: 4, channel: "sms" }, drinks: { on: true, times: ["09:00"], channel: "sms" } }),
    });
    expect((await queueDueReminders({ now: new Date("2026-12-17T09:01:00Z"), timeZone: tz })).queued).toBe(1);
    expect((await rows(userId)).map((r) => r.idempotencyKey).filter((k) => k.includes("2026-12-17"))).toEqual([`reminder:${userId}:drinks:2026-12-17T09:00`]);
  });
});
