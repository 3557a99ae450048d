// The portal's reach settings: a browser's push subscription (patient and carer, for themselves),
// the mobile number (E.164) with consent to texts, quiet hours, and the patient's reminders.
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { DELETE as unsubscribe, GET as pushKey, POST as subscribe } from "@/app/api/account/push/route";
import { GET as getReach, PUT as putReach } from "@/app/api/account/reach/route";
import { db } from "@/db";
import { carerLinks, pushSubscriptions, reachSettings } from "@/db/schema";
import { userIdByEmail } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";
import { browserKeys } from "../support/push-endpoint";

const sub = (endpoint: string, keys = browserKeys()) => ({ endpoint, keys: { p256dh: keys.p256dh, auth: keys.auth }, expirationTime: null });

describe("push subscriptions", () => {
  it("gives the public key, stores the browser's subscription per person, and removes only one's own", async () => {
    const patient = await sessionFor("patient");
    const carer = await sessionFor("carer");
    const key = await (await call(pushKey, "/api/account/push", { cookie: patient })).json();
    expect(key.publicKey).toMatch(/^[A-Za-z0-9_-]{80,}$/);
    const endpoint = "https://push.example.com/send/abc123";
    expect((await call(subscribe, "/api/account/push", { method: "POST", cookie: patient, body: sub(endpoint) })).status).toBe(201);
    const patientId = await userIdByEmail(demo.patient.email);
    expect(await db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, patientId))).toHaveLength(1);
    // The carer cannot remove the patient's subscription.
    expect(await (await call(unsubscribe, "/api/account/push", { method: "DELETE", cookie: carer, body: { endpoint } })).json()).toEqual({ removed: 0 });
    expect(await (await call(unsubscribe, "/api/account/push", { method: "DELETE", cookie: patient, body: { endpoint } })).json()).toEqual({ removed: 1 });
    expect(await db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, patientId))).toHaveLength(0);
  });

  it("refuses an endpoint on the server's own network or with malformed keys, writing nothing", async () => {
    const patient = await sessionFor("patient");
    const before = (await db.select().from(pushSubscriptions)).length;
    for (const endpoint of ["http://push.example.com/x", "https://127.0.0.1/x", "https://localhost/x", "https://[::1]/x", "https://db.internal/x", "https://10.0.0.1/x"]) {
      expect((await call(subscribe, "/api/account/push", { method: "POST", cookie: patient, body: sub(endpoint) })).status, endpoint).toBe(400);
    }
    const bad = { endpoint: "https://push.example.com/y", keys: { p256dh: "short", auth: "x" } };
    expect((await call(subscribe, "/api/account/push", { method: "POST", cookie: patient, body: bad })).status).toBe(400);
    expect((await db.select().from(pushSubscriptions)).length).toBe(before);
  });
});

describe("number, consent to texts, quiet hours and reminders", () => {
  const reminders = { bag: { on: true, times: ["08:30"], day: 1, channel: "sms" } };

  it("keeps the number as E.164, and a text reminder needs the number and the person's yes", async () => {
    const patient = await sessionFor("patient");
    const noConsent = await call(putReach, "/api/account/reach", { method: "PUT", cookie: patient, body: { phone: "+44 7700 900123", smsConsent: false, quietStart: "22:00", quietEnd: "07:00", reminders } });
    expect(noConsent.status).toBe(400);
    expect((await noConsent.json()).error.fields.smsConsent).toEqual(["sms_consent"]);
    const noPhone = await call(putReach, "/api/account/reach", { method: "PUT", cookie: patient, body: { phone: "", smsConsent: true, quietStart: "22:00", quietEnd: "07:00", reminders } });
    expect(noPhone.status).toBe(400);
    const badPhone = await call(putReach, "/api/account/reach", { method: "PUT", cookie: patient, body: { phone: "07700 900123", smsConsent: true, quietStart: "22:00", quietEnd: "07:00" } });
    expect(badPhone.status).toBe(400);
    expect((await badPhone.json()).error.fields.phone).toEqual(["phone_format"]);
    const ok = await call(putReach, "/api/account/reach", { method: "PUT", cookie: patient, body: { phone: "+44 7700 900123", smsConsent: true, quietStart: "21:30", quietEnd: "07:15", reminders } });
    expect(ok.status).toBe(200);
    const got = (await (await call(getReach, "/api/account/reach", { cookie: patient })).json()).reach;
    expect(got).toEqual({ phone: "+447700900123", smsConsent: true, quietStart: "21:30", quietEnd: "07:15", reminders });
    const [row] = await db.select().from(reachSettings).where(eq(reachSettings.userId, await userIdByEmail(demo.patient.email)));
    expect(row.smsConsentAt).toBeInstanceOf(Date);
  });

  it("a carer sets her own number, but reminders are the patient's: 403", async () => {
    const carer = await sessionFor("carer");
    const body = { phone: "+447700900999", smsConsent: true, quietStart: "22:00", quietEnd: "07:00" };
    expect((await call(putReach, "/api/account/reach", { method: "PUT", cookie: carer, body })).status).toBe(200);
    expect((await call(putReach, "/api/account/reach", { method: "PUT", cookie: carer, body: { ...body, reminders } })).status).toBe(403);
    expect((await (await call(getReach, "/api/account/reach", { cookie: carer })).json()).reach.reminders).toEqual({});
  });

  it("refuses a time that is not HH:MM and an unknown reminder", async () => {
    const patient = await sessionFor("patient");
    const base = { phone: "", smsConsent: false, quietStart: "22:00", quietEnd: "07:00" };
    for (const body of [{ ...base, quietStart: "25:00" }, { ...base, reminders: { bag: { on: true, times: ["8am"], channel: "push" } } }, { ...base, reminders: { lunch: { on: true, times: ["12:00"], channel: "push" } } }]) {
      expect((await call(putReach, "/api/account/reach", { method: "PUT", cookie: patient, body })).status, JSON.stringify(body)).toBe(400);
    }
  });
});

describe("rules the database holds", () => {
  it("refuses a number that is not E.164, quiet hours that are not HH:MM, and an unknown alert channel", async () => {
    const userId = await userIdByEmail(demo.carer.email);
    await expect(db.insert(reachSettings).values({ userId, phone: "07700900123" }).onConflictDoUpdate({ target: reachSettings.userId, set: { phone: "07700900123" } })).rejects.toThrow();
    await expect(db.insert(reachSettings).values({ userId, quietStart: "7am" }).onConflictDoUpdate({ target: reachSettings.userId, set: { quietStart: "7am" } })).rejects.toThrow();
    await expect(db.update(carerLinks).set({ alertChannel: "pigeon" as "email" }).where(eq(carerLinks.carerUserId, userId))).rejects.toThrow();
  });
});
