// A carer's alert (the patient reported an urgent or emergency problem) by the channel she chose:
// a text through the SMS service's SDK, a push to her phones, else e-mail. When the chosen channel
// cannot reach her (no number, no consent, no subscribed phone) the e-mail goes as well.
import { randomUUID } from "node:crypto";
import { eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PUT as carerAlerts } from "@/app/api/portal/carer-alerts/route";
import { db } from "@/db";
import { setReach } from "@/db/queries/reach";
import { carerLinks, outboundMessages, pushSubscriptions } from "@/db/schema";
import { queueCarerAlerts } from "@/lib/email/carer-mail";
import type { MailTransport } from "@/lib/email/transport";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { createSmsSender } from "@/lib/sms/client";
import { startFakeSms } from "@/scripts/fake-sms";
import { patientIdByHrn, userIdByEmail } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";
import { freePort } from "../support/mail";

const noMail = { sendMail: async () => {}, close: () => {} } as unknown as MailTransport;
let sms: Awaited<ReturnType<typeof startFakeSms>>;
let port: number;
beforeAll(async () => {
  port = await freePort();
  sms = await startFakeSms({ port });
});
afterAll(() => sms?.close());

const rowsFor = (checkInId: string) => db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `carer-alert:${checkInId}:%`));

describe("carer alerts by push or text", () => {
  it("the carer chooses text on her alert; the alert reaches the SMS service, and no e-mail", async () => {
    const arthur = await patientIdByHrn("EM-100-001");
    const carer = await sessionFor("carer");
    const carerId = await userIdByEmail(demo.carer.email);
    await setReach({ userId: carerId, reach: { phone: "+447700900333", smsConsent: true, quietStart: "22:00", quietEnd: "07:00", reminders: {} } });
    const res = await call(carerAlerts, "/api/portal/carer-alerts", { method: "PUT", cookie: carer, body: { patientId: arthur, on: true, channel: "sms" } });
    expect(res.status).toBe(200);
    expect((await call(carerAlerts, "/api/portal/carer-alerts", { method: "PUT", cookie: carer, body: { patientId: arthur, on: true, channel: "pigeon" } })).status).toBe(400);
    const checkInId = randomUUID();
    await db.transaction((tx) => queueCarerAlerts(tx, { patientId: arthur, checkInId, level: "urgent" }));
    const rows = await rowsFor(checkInId);
    expect(rows.map((r) => r.channel)).toEqual(["sms"]);
    await drainOutbox({ transport: noMail, sms: createSmsSender({ apiUrl: `http://127.0.0.1:${port}` }), keyPrefix: `carer-alert:${checkInId}:`, log: () => {} });
    const got = sms.messages.filter((m) => m.to === "447700900333");
    expect(got).toHaveLength(1);
    expect(got[0].text).toContain("Arthur");
  });

  it("with no consent to texts, or no phone subscribed for push, the e-mail goes as well", async () => {
    const arthur = await patientIdByHrn("EM-100-001");
    const carerId = await userIdByEmail(demo.carer.email);
    await setReach({ userId: carerId, reach: { phone: "+447700900333", smsConsent: false, quietStart: "22:00", quietEnd: "07:00", reminders: {} } });
    const first = randomUUID();
    await db.transaction((tx) => queueCarerAlerts(tx, { patientId: arthur, checkInId: first, level: "emergency" }));
    expect((await rowsFor(first)).map((r) => [r.channel, r.status]).sort()).toEqual([["email", "queued"], ["sms", "failed"]]);

    await db.update(carerLinks).set({ alertChannel: "push" }).where(eq(carerLinks.carerUserId, carerId));
    await db.delete(pushSubscriptions).where(eq(pushSubscriptions.userId, carerId));
    const second = randomUUID();
    await db.transaction((tx) => queueCarerAlerts(tx, { patientId: arthur, checkInId: second, level: "urgent" }));
    expect((await rowsFor(second)).map((r) => [r.channel, r.status]).sort()).toEqual([["email", "queued"], ["push", "failed"]]);
  });
});
