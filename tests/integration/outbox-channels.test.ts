// Texts and pushes go through the same outbox as e-mail (docs/email.md): one row per key, nothing
// lost while the SMS service is down, sent once when it is back; a push is a real Web Push
// message (decrypted here with the subscription's keys, RFC 8291), and a 404/410 from the push
// service removes the subscription.
import { eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { outboundMessages, pushSubscriptions } from "@/db/schema";
import { savePushSubscription } from "@/db/queries/push-subscriptions";
import { queuePush, queueText } from "@/lib/email/outbox";
import type { MailTransport } from "@/lib/email/transport";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { createPushSender } from "@/lib/push/send";
import { createSmsSender } from "@/lib/sms/client";
import { startFakeSms } from "@/scripts/fake-sms";
import { userIdByEmail } from "../support/fixtures";
import { demo } from "../support/http";
import { freePort } from "../support/mail";
import { browserKeys, decryptPush, startPushEndpoint } from "../support/push-endpoint";

const quiet = () => {};
const tag = () => Math.random().toString(36).slice(2, 10);
const noMail = { sendMail: async () => { throw new Error("no e-mail expected"); }, close: () => {} } as unknown as MailTransport;
const rowsWith = (prefix: string) => db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `${prefix}%`));

let sms: Awaited<ReturnType<typeof startFakeSms>>;
let smsPort: number;
let push: Awaited<ReturnType<typeof startPushEndpoint>>;
beforeAll(async () => {
  smsPort = await freePort();
  sms = await startFakeSms({ port: smsPort });
  push = await startPushEndpoint();
});
afterAll(async () => {
  await sms?.close().catch(() => {});
  await push?.close();
});

const smsSender = () => createSmsSender({ apiUrl: `http://127.0.0.1:${smsPort}`, timeoutMs: 2_000 });

describe("text messages through the outbox", () => {
  it("reaches the SMS service through its SDK, once per key, in the person's script", async () => {
    const key = `test-sms:${tag()}:`;
    const text = "تذكير: حان وقت تغيير كيس الساق";
    const first = await db.transaction((tx) => queueText(tx, { idempotencyKey: `${key}a`, kind: "reminder", to: "+447700900123", text, locale: "ar" }));
    const again = await db.transaction((tx) => queueText(tx, { idempotencyKey: `${key}a`, kind: "reminder", to: "+447700900123", text: "other" }));
    expect(again).toMatchObject({ id: first.id, created: false });
    const result = await drainOutbox({ transport: noMail, sms: smsSender(), keyPrefix: key, log: quiet });
    expect(result.sent).toBe(1);
    const got = sms.messages.filter((m) => m.clientRef === first.id);
    expect(got).toHaveLength(1);
    expect(got[0]).toMatchObject({ to: "447700900123", text, from: "Caddis" });
    const [row] = await rowsWith(key);
    expect(row).toMatchObject({ channel: "sms", status: "sent", attempts: 1 });
    // The JSON endpoint the e2e test reads.
    const listed = (await (await fetch(`http://127.0.0.1:${smsPort}/api/messages?to=447700900123`)).json()) as { text: string }[];
    expect(listed.some((m) => m.text === text)).toBe(true);
  });

  it("keeps a text with no valid number as failed (no_recipient) and sends nothing", async () => {
    const key = `test-sms:${tag()}:`;
    const r = await db.transaction((tx) => queueText(tx, { idempotencyKey: key, kind: "reminder", to: "07700 900123", text: "x" }));
    expect(r.status).toBe("failed");
    const [row] = await rowsWith(key);
    expect(row).toMatchObject({ status: "failed", lastError: "no_recipient", toAddress: "" });
  });

  it("loses nothing while the service answers 500 or is down, and sends once when it is back", async () => {
    const key = `test-sms:${tag()}:`;
    const to = "+447700900456";
    await db.transaction(async (tx) => {
      for (const i of [0, 1]) await queueText(tx, { idempotencyKey: `${key}${i}`, kind: "reminder", to, text: `Outage ${key}${i}` });
    });
    sms.state.failWith = 500;
    const down = await drainOutbox({ transport: noMail, sms: smsSender(), keyPrefix: key, log: quiet, retryBaseMs: 60_000 });
    expect(down).toMatchObject({ sent: 0, retry: 2 });
    // Stopped altogether: connection refused.
    await sms.close();
    await db.update(outboundMessages).set({ nextAttemptAt: new Date(Date.now() - 1000) }).where(like(outboundMessages.idempotencyKey, `${key}%`));
    const gone = await drainOutbox({ transport: noMail, sms: smsSender(), keyPrefix: key, log: quiet, retryBaseMs: 60_000 });
    expect(gone).toMatchObject({ sent: 0, retry: 2 });
    for (const row of await rowsWith(key)) expect(row).toMatchObject({ status: "queued", attempts: 2 });
    expect(sms.messages.filter((m) => m.text.startsWith(`Outage ${key}`))).toHaveLength(0);

    sms = await startFakeSms({ port: smsPort });
    // A retry not yet due is not sent early.
    expect(await drainOutbox({ transport: noMail, sms: smsSender(), keyPrefix: key, log: quiet })).toMatchObject({ sent: 0 });
    await db.update(outboundMessages).set({ nextAttemptAt: new Date(Date.now() - 1000) }).where(like(outboundMessages.idempotencyKey, `${key}%`));
    expect(await drainOutbox({ transport: noMail, sms: smsSender(), keyPrefix: key, log: quiet })).toMatchObject({ sent: 2, retry: 0 });
    expect(await drainOutbox({ transport: noMail, sms: smsSender(), keyPrefix: key, log: quiet })).toMatchObject({ sent: 0 });
    const arrived = sms.messages.filter((m) => m.text.startsWith(`Outage ${key}`));
    expect(arrived.map((m) => m.text).sort()).toEqual([`Outage ${key}0`, `Outage ${key}1`]);
    for (const row of await rowsWith(key)) expect(row).toMatchObject({ status: "sent", attempts: 3 });
  });
});

describe("Web Push through the outbox", () => {
  it("delivers an encrypted payload that the subscription's keys decrypt, with a VAPID signature", async () => {
    const userId = await userIdByEmail(demo.patient.email);
    const keys = browserKeys();
    const pathname = `/push/${tag()}`;
    const sub = await savePushSubscription({ userId, endpoint: `${push.url}${pathname}`, p256dh: keys.p256dh, auth: keys.auth });
    const key = `test-push:${tag()}`;
    const queued = await db.transaction((tx) =>
      queuePush(tx, { idempotencyKey: key, kind: "reminder", userId, title: "Bag change", body: "Time to change your leg bag.", link: "/en/more/reminders" }),
    );
    expect(queued.length).toBeGreaterThanOrEqual(1);
    const sender = createPushSender({ agent: push.agent });
    const result = await drainOutbox({ transport: noMail, push: sender, keyPrefix: key, log: quiet });
    expect(result.sent).toBe(queued.length);
    const mine = push.received.filter((r) => r.path === pathname);
    expect(mine).toHaveLength(1);
    expect(mine[0].headers["content-encoding"]).toBe("aes128gcm");
    expect(String(mine[0].headers.authorization)).toMatch(/^vapid t=.+, k=.+/);
    const payload = JSON.parse(decryptPush(mine[0].body, keys)) as Record<string, string>;
    expect(payload).toMatchObject({ title: "Bag change", body: "Time to change your leg bag.", url: "/en/more/reminders" });
    const [row] = await rowsWith(`${key}:${sub.id}`);
    expect(row).toMatchObject({ channel: "push", status: "sent" });
    await db.delete(pushSubscriptions).where(eq(pushSubscriptions.id, sub.id));
  });

  it("a 410 from the push service removes the subscription and does not try again", async () => {
    const userId = await userIdByEmail(demo.carer.email);
    const keys = browserKeys();
    const sub = await savePushSubscription({ userId, endpoint: `${push.url}/push/gone-${tag()}`, p256dh: keys.p256dh, auth: keys.auth });
    const key = `test-push:${tag()}`;
    await db.transaction((tx) => queuePush(tx, { idempotencyKey: key, kind: "carer-alert", userId, title: "t", body: "b", link: "/en" }));
    push.state.status = 410;
    try {
      const result = await drainOutbox({ transport: noMail, push: createPushSender({ agent: push.agent }), keyPrefix: key, log: quiet });
      expect(result).toMatchObject({ sent: 0, failed: 1, retry: 0 });
    } finally {
      push.state.status = 201;
    }
    expect(await db.select().from(pushSubscriptions).where(eq(pushSubscriptions.id, sub.id))).toHaveLength(0);
    const [row] = await rowsWith(`${key}:${sub.id}`);
    expect(row).toMatchObject({ status: "failed" });
    expect(row.lastError).toMatch(/subscription_gone/);
  });

  it("with no subscribed browser, keeps one failed row (no_recipient) so the gap shows", async () => {
    const userId = await userIdByEmail(demo.patientAr.email);
    await db.delete(pushSubscriptions).where(eq(pushSubscriptions.userId, userId));
    const key = `test-push:${tag()}`;
    const [r] = await db.transaction((tx) => queuePush(tx, { idempotencyKey: key, kind: "reminder", userId, title: "t", body: "b", link: "/ar" }));
    expect(r.status).toBe("failed");
    const [row] = await rowsWith(key);
    expect(row).toMatchObject({ channel: "push", lastError: "no_recipient" });
  });
});
