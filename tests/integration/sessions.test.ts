// Sessions (ASVS 5.0.0 chapter 7): the token lives only in the HttpOnly cookie — no JSON answer
// carries it, sign-in's included — a person sees their own sessions (device, last used,
// approximate address) and ends any of them, and a new password ends all the others.
import { and, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { DELETE as endOne } from "@/app/api/account/sessions/[sessionId]/route";
import { POST as adminSignOut } from "@/app/api/admin/staff/[userId]/sign-out/route";
import { DELETE as endOthers, GET as listSessions } from "@/app/api/account/sessions/route";
import { GET as authGet, POST as authPost } from "@/app/api/auth/[...all]/route";
import { GET as me } from "@/app/api/me/route";
import { db } from "@/db";
import { auditEvents, session, user } from "@/db/schema";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";
import { SESSION_MAX_HOURS } from "@/lib/auth/session";
import { call, demo, request, sessionFor, signIn, totpCode } from "../support/http";
import { createStaff, orgIdsByName } from "../support/staff";

const phone = "Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0.0.0 Mobile Safari/537.36";
const laptop = "Mozilla/5.0 (Windows NT 10.0; Win64; x64; rv:133.0) Gecko/20100101 Firefox/133.0";

/** A sign-in from a given browser and address, through better-auth's handler; its cookie. */
async function signInFrom(email: string, password: string, userAgent: string, ip: string) {
  const res = await authPost(request("/api/auth/sign-in/email", { body: { email, password }, headers: { "user-agent": userAgent, [CLIENT_ADDRESS_HEADER]: ip } }));
  expect(res.status).toBe(200);
  return { res, cookie: res.headers.getSetCookie().map((c) => c.split(";")[0]).filter((c) => c.includes("session_token")).join("; ") };
}

async function tokensOf(email: string) {
  const rows = await db.select({ token: session.token }).from(session).innerJoin(user, eq(user.id, session.userId)).where(eq(user.email, email));
  return rows.map((r) => r.token);
}

describe("no token outside the cookie", () => {
  it("sign-in, the second step, the session endpoint and a password change answer without the session token", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [] });
    const first = await authPost(request("/api/auth/sign-in/email", { body: { email: nurse.email, password: nurse.password }, headers: { [CLIENT_ADDRESS_HEADER]: "10.61.9.1" } }));
    const firstText = await first.text();
    const pending = first.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const second = await authPost(request("/api/auth/two-factor/verify-totp", { body: { code: totpCode(nurse.totp!) }, cookie: pending, headers: { [CLIENT_ADDRESS_HEADER]: "10.61.9.1" } }));
    expect(second.status).toBe(200);
    const secondBody = await second.json();
    expect(secondBody.user.email).toBe(nurse.email);
    const cookie = second.headers.getSetCookie().map((c) => c.split(";")[0]).filter((c) => c.includes("session_token")).join("; ");

    const patient = await signInFrom(demo.patient.email, demo.patient.password, laptop, "10.61.9.2");
    const patientBody = await patient.res.json();
    expect(patientBody.user.email).toBe(demo.patient.email);

    const got = await authGet(request("/api/auth/get-session", { cookie }));
    const gotBody = await got.json();
    expect(gotBody.session.userId).toBe(nurse.id);

    const changed = await authPost(
      request("/api/auth/change-password", { body: { currentPassword: nurse.password, newPassword: "Testwick-changed-pass-2026" }, cookie, headers: { [CLIENT_ADDRESS_HEADER]: "10.61.9.1" } }),
    );
    expect(changed.status).toBe(200);
    const changedText = await changed.text();

    const everyToken = [...(await tokensOf(nurse.email)), ...(await tokensOf(demo.patient.email))];
    expect(everyToken.length).toBeGreaterThan(0);
    for (const text of [firstText, JSON.stringify(secondBody), JSON.stringify(patientBody), JSON.stringify(gotBody), changedText]) {
      expect(text).not.toMatch(/"token"/);
      for (const token of everyToken) expect(text).not.toContain(token);
    }
    // The cookie itself is HttpOnly.
    expect(patient.res.headers.getSetCookie().find((c) => c.includes("session_token"))).toMatch(/HttpOnly/i);
  });

  it("better-auth's own session list and revoke endpoints are closed (Caddis's routes replace them)", async () => {
    const { cookie } = await signInFrom(demo.carer.email, demo.carer.password, laptop, "10.61.9.3");
    expect((await authGet(request("/api/auth/list-sessions", { cookie }))).status).toBe(404);
    for (const path of ["/api/auth/revoke-session", "/api/auth/revoke-sessions", "/api/auth/revoke-other-sessions"]) {
      expect((await authPost(request(path, { body: { token: "x" }, cookie }))).status).toBe(404);
    }
  });
});

describe("your sessions", () => {
  it("lists the person's own sessions: device, last used, approximate address — and no token", async () => {
    const onPhone = await signInFrom(demo.patientAr.email, demo.patientAr.password, phone, "203.0.113.57");
    const onLaptop = await signInFrom(demo.patientAr.email, demo.patientAr.password, laptop, "198.51.100.23");
    await signInFrom(demo.patient.email, demo.patient.password, laptop, "198.51.100.24"); // someone else's
    const res = await call(listSessions, "/api/account/sessions", { cookie: onLaptop.cookie, headers: { "user-agent": laptop, [CLIENT_ADDRESS_HEADER]: "198.51.100.23" } });
    expect(res.status).toBe(200);
    const text = await res.text();
    for (const token of [...(await tokensOf(demo.patientAr.email)), ...(await tokensOf(demo.patient.email))]) expect(text).not.toContain(token);
    expect(text).not.toMatch(/token/i);
    const { sessions } = JSON.parse(text) as { sessions: Record<string, unknown>[] };
    expect(sessions.length).toBe((await tokensOf(demo.patientAr.email)).length);
    expect(Object.keys(sessions[0]!).sort()).toEqual(["approximateAddress", "browser", "current", "id", "kind", "lastSeenAt", "os", "signedInAt"]);
    // This device first.
    expect(sessions[0]).toMatchObject({ current: true, browser: "Firefox", os: "Windows", kind: "computer", approximateAddress: "198.51.100.x" });
    const phoneRow = sessions.find((s) => s.approximateAddress === "203.0.113.x");
    expect(phoneRow).toMatchObject({ current: false, browser: "Chrome", os: "Android", kind: "phone" });
    // The full address is not handed out.
    expect(text).not.toContain("203.0.113.57");
    expect(onPhone.cookie).not.toBe(onLaptop.cookie);
  });

  it("ends one other session at once; another person's session id is 404 and stays", async () => {
    const a = await signInFrom(demo.patient.email, demo.patient.password, phone, "10.61.1.1");
    const b = await signInFrom(demo.patient.email, demo.patient.password, laptop, "10.61.1.2");
    const stranger = await signInFrom(demo.carer.email, demo.carer.password, laptop, "10.61.1.3");
    const list = async (cookie: string) => ((await (await call(listSessions, "/api/account/sessions", { cookie })).json()) as { sessions: { id: string; current: boolean }[] }).sessions;
    const phoneSession = (await list(a.cookie)).find((s) => s.current)!;
    const strangerSession = (await list(stranger.cookie)).find((s) => s.current)!;

    const refused = await call(endOne, `/api/account/sessions/${strangerSession.id}`, { method: "DELETE", cookie: b.cookie, params: { sessionId: strangerSession.id } });
    expect(refused.status).toBe(404);
    expect((await call(me, "/api/me", { cookie: stranger.cookie })).status).toBe(200);

    const ended = await call(endOne, `/api/account/sessions/${phoneSession.id}`, { method: "DELETE", cookie: b.cookie, params: { sessionId: phoneSession.id } });
    expect(ended.status).toBe(200);
    expect(await ended.json()).toEqual({ endedCurrent: false });
    expect((await call(me, "/api/me", { cookie: a.cookie })).status).toBe(401);
    expect((await call(me, "/api/me", { cookie: b.cookie })).status).toBe(200);
    const patientId = (await db.select({ id: user.id }).from(user).where(eq(user.email, demo.patient.email)))[0]!.id;
    expect(await db.select().from(auditEvents).where(and(eq(auditEvents.action, "account.session_end"), eq(auditEvents.actorUserId, patientId)))).toHaveLength(1);
  });

  it("signs out every other device at once, keeping this one", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [] });
    const cookies = [await signIn(nurse.email, nurse.password), await signIn(nurse.email, nurse.password), await signIn(nurse.email, nurse.password)];
    const res = await call(endOthers, "/api/account/sessions", { method: "DELETE", cookie: cookies[2] });
    expect(await res.json()).toEqual({ ended: 2 });
    expect((await call(me, "/api/me", { cookie: cookies[0] })).status).toBe(401);
    expect((await call(me, "/api/me", { cookie: cookies[1] })).status).toBe(401);
    expect((await call(me, "/api/me", { cookie: cookies[2] })).status).toBe(200);
  });

  it("keeps 'last used' and the address up to date, writing at most every 5 minutes", async () => {
    const { cookie } = await signInFrom(demo.carer.email, demo.carer.password, laptop, "10.61.2.1");
    const carerId = (await db.select({ id: user.id }).from(user).where(eq(user.email, demo.carer.email)))[0]!.id;
    await db.update(session).set({ lastSeenAt: sql`now() - interval '10 minutes'` }).where(eq(session.userId, carerId));
    await call(me, "/api/me", { cookie, headers: { "user-agent": phone, [CLIENT_ADDRESS_HEADER]: "192.0.2.77" } });
    const [row] = await db.select().from(session).where(and(eq(session.userId, carerId), eq(session.ipAddress, "192.0.2.77")));
    expect(row).toBeTruthy();
    expect(Date.now() - row!.lastSeenAt.getTime()).toBeLessThan(60_000);
    expect(row!.userAgent).toBe(phone);
    // Within 5 minutes nothing is written again.
    await call(me, "/api/me", { cookie, headers: { [CLIENT_ADDRESS_HEADER]: "192.0.2.78" } });
    const [same] = await db.select().from(session).where(eq(session.id, row!.id));
    expect(same!.ipAddress).toBe("192.0.2.77");
  });
});

describe("a new password", () => {
  it("ends every other session, even when the client asks to keep them", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [] });
    const other = await signIn(nurse.email, nurse.password);
    const current = await signIn(nurse.email, nurse.password);
    const res = await authPost(
      request("/api/auth/change-password", {
        body: { currentPassword: nurse.password, newPassword: "Testwick-brand-new-pass-26", revokeOtherSessions: false },
        cookie: current,
        headers: { [CLIENT_ADDRESS_HEADER]: "10.61.3.1" },
      }),
    );
    expect(res.status).toBe(200);
    expect((await call(me, "/api/me", { cookie: other })).status).toBe(401);
    // The device that changed it stays signed in, on its new cookie.
    const renewed = res.headers.getSetCookie().map((c) => c.split(";")[0]).filter((c) => c.includes("session_token")).join("; ");
    expect((await call(me, "/api/me", { cookie: renewed })).status).toBe(200);
  });
});

describe("session lifetime", () => {
  it("ends a session a fixed time after sign-in however active: 13 h for staff, 30 days for patients (ASVS 7.3.2)", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [] });
    const staffCookie = await signIn(nurse.email, nurse.password);
    const age = async (userId: string, hours: number) =>
      db.update(session).set({ createdAt: sql`now() - make_interval(hours => ${hours})` }).where(eq(session.userId, userId));
    await age(nurse.id, SESSION_MAX_HOURS.staff - 1);
    expect((await call(me, "/api/me", { cookie: staffCookie })).status).toBe(200);
    await age(nurse.id, SESSION_MAX_HOURS.staff + 1);
    expect((await call(me, "/api/me", { cookie: staffCookie })).status).toBe(401);
    expect(await db.select().from(session).where(eq(session.userId, nurse.id))).toHaveLength(0);

    const { cookie } = await signInFrom(demo.patientAr.email, demo.patientAr.password, phone, "10.61.4.1");
    const yusuf = (await db.select({ id: user.id }).from(user).where(eq(user.email, demo.patientAr.email)))[0]!.id;
    await age(yusuf, SESSION_MAX_HOURS.staff + 1);
    expect((await call(me, "/api/me", { cookie })).status).toBe(200);
    await age(yusuf, SESSION_MAX_HOURS.portal + 1);
    expect((await call(me, "/api/me", { cookie })).status).toBe(401);
  });
});

describe("an admin", () => {
  it("signs a member of staff of their organisation out on every device (ASVS 7.4.5); another organisation's is 404", async () => {
    const orgs = await orgIdsByName(["Larch Ward", "Millbrook Surgery"]);
    const nurse = await createStaff({ role: "clinician", organisationIds: [orgs["Larch Ward"]!] });
    const stranger = await createStaff({ role: "clinician", organisationIds: [orgs["Millbrook Surgery"]!] });
    const cookies = [await signIn(nurse.email, nurse.password), await signIn(nurse.email, nurse.password)];
    const strangerCookie = await signIn(stranger.email, stranger.password);
    const admin = await sessionFor("admin");
    const res = await call(adminSignOut, `/api/admin/staff/${nurse.id}/sign-out`, { cookie: admin, body: {}, params: { userId: nurse.id } });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ userId: nurse.id, sessionsEnded: 2 });
    for (const cookie of cookies) expect((await call(me, "/api/me", { cookie })).status).toBe(401);
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "admin.staff.sessions_end"));
    expect(event!.details).toMatchObject({ userId: nurse.id, sessionsEnded: 2 });

    const refused = await call(adminSignOut, `/api/admin/staff/${stranger.id}/sign-out`, { cookie: admin, body: {}, params: { userId: stranger.id } });
    expect(refused.status).toBe(404);
    expect((await call(me, "/api/me", { cookie: strangerCookie })).status).toBe(200);
  });
});
