// Guessing one account's password from many addresses (OWASP Authentication Cheat Sheet,
// "Account Lockout"; ASVS 5.0.0 6.1.1, 6.3.1, 16.3.1): the account's own count slows it down,
// the owner is told by e-mail through the outbox, every wrong try is audited, and the admin can
// see the account — while the real user still gets in within the bounds in lib/auth/sign-in-throttle.ts.
import { and, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { GET as me } from "@/app/api/me/route";
import { db } from "@/db";
import { accountsUnderAttack } from "@/db/queries/sign-in-attempts";
import { auditEvents, outboundMessages, signInThrottles } from "@/db/schema";
import { ACCOUNT_LIMITS, accountKey } from "@/lib/auth/sign-in-throttle";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";
import { call, request, totpCode } from "../support/http";
import { createStaff, orgIdsByName } from "../support/staff";

let net = 0;
/** A sign-in attempt from its own address (as from a botnet), with any cookies given. */
async function attempt(email: string, password: string, { cookie, ip }: { cookie?: string; ip?: string } = {}) {
  const address = ip ?? `10.${50 + Math.floor(net / 250)}.${net % 250}.${(net++ % 200) + 1}`;
  const res = await authPost(request("/api/auth/sign-in/email", { body: { email, password }, cookie, headers: { [CLIENT_ADDRESS_HEADER]: address } }));
  const setCookies = res.headers.getSetCookie().map((c) => c.split(";")[0]);
  return { res, status: res.status, retryAfter: Number(res.headers.get("retry-after") ?? 0), setCookies, body: await res.json().catch(() => null) };
}

const cookieNamed = (cookies: string[], name: string) => cookies.filter((c) => c.includes(name)).join("; ");

/** The right password and then the code (staff sign in in two steps): a full sign-in, its cookies. */
async function fullSignIn(who: { email: string; password: string; totp: string | null }, { cookie }: { cookie?: string } = {}) {
  const first = await attempt(who.email, who.password, { cookie });
  if (first.status !== 200 || !first.body?.twoFactorRedirect) return first;
  const second = await authPost(
    request("/api/auth/two-factor/verify-totp", {
      body: { code: totpCode(who.totp!) },
      cookie: [cookie, ...first.setCookies].filter(Boolean).join("; "),
      headers: { [CLIENT_ADDRESS_HEADER]: "10.48.0.1" },
    }),
  );
  // Cookies the steps cleared (an empty value) are left out.
  const cookies = [...first.setCookies, ...second.headers.getSetCookie().map((c) => c.split(";")[0]!)].filter((c) => !c.endsWith("="));
  return { ...first, status: second.status, setCookies: cookies };
}

async function throttleOf(email: string) {
  const [row] = await db.select().from(signInThrottles).where(eq(signInThrottles.accountKey, accountKey(email)));
  return row;
}

/** Time passing, as far as the delay is concerned: the hold ends now. */
async function endHold(email: string) {
  await db.update(signInThrottles).set({ blockedUntil: sql`now() - interval '1 second'` }).where(eq(signInThrottles.accountKey, accountKey(email)));
}

async function victim() {
  const orgs = await orgIdsByName(["Harbourside Community Nursing Team"]);
  return createStaff({ role: "clinician", organisationIds: [orgs["Harbourside Community Nursing Team"]!] });
}

describe("30 wrong passwords for one account from 30 addresses", () => {
  it("are slowed after the first 5, told to the owner once by e-mail, audited, and shown to the admin", { timeout: 180_000 }, async () => {
    const nurse = await victim();
    const results = [];
    for (let i = 0; i < 30; i++) results.push(await attempt(nurse.email, `not-the-password-${i}`));
    const statuses = results.map((r) => r.status);
    // The first 5 are checked (401); then the account makes each check wait 1 s, 2 s, 4 s…
    // and tries made while it waits are refused unchecked (429): only a few more get checked.
    expect(statuses.slice(0, ACCOUNT_LIMITS.freeFailures)).toEqual(Array(ACCOUNT_LIMITS.freeFailures).fill(401));
    const checked = statuses.filter((s) => s === 401).length;
    expect(checked).toBeLessThanOrEqual(ACCOUNT_LIMITS.freeFailures + 3);
    expect(statuses.filter((s) => s === 429).length).toBe(30 - checked);
    for (const r of results.filter((x) => x.status === 429)) {
      expect(r.body).toMatchObject({ code: "ACCOUNT_DELAYED" });
      expect(r.retryAfter).toBeGreaterThanOrEqual(1);
      expect(r.retryAfter).toBeLessThanOrEqual(ACCOUNT_LIMITS.maxDelaySeconds);
    }

    const row = await throttleOf(nurse.email);
    expect(row).toMatchObject({ userId: nurse.id, failedAttempts: checked, heldAttempts: 30 - checked, consecutiveFailures: checked });
    expect(row.addressHashes).toHaveLength(30);

    // Reported: one e-mail to the owner through the outbox, after the 10th try.
    const mails = await db.select().from(outboundMessages).where(and(eq(outboundMessages.kind, "sign-in-attempts"), eq(outboundMessages.toAddress, nurse.email)));
    expect(mails).toHaveLength(1);
    expect(mails[0].text).toContain("10 times");
    expect(mails[0].text).toContain("10 places");
    expect(mails[0].text).toMatch(/\/en\/forgot-password/);

    // Audited: each checked failure, and the notice; never the address itself.
    const failed = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "account.sign_in_failed"), sql`${auditEvents.details}->>'accountUserId' = ${nurse.id}`));
    expect(failed).toHaveLength(checked);
    expect(failed.every((e) => e.ipHash && !/10\.5/.test(JSON.stringify(e)))).toBe(true);
    expect(failed.at(-1)!.details).toMatchObject({ step: "password", consecutiveFailures: checked });
    const notices = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "account.sign_in_attempts_notice"), sql`${auditEvents.details}->>'accountUserId' = ${nurse.id}`));
    expect(notices).toHaveLength(1);

    // The admin of the nurse's organisation sees the account; an admin of another does not.
    const [adminOrg] = Object.values(await orgIdsByName(["Harbourside Community Nursing Team"]));
    const listed = await accountsUnderAttack({ organisationIds: [adminOrg!] });
    expect(listed.find((a) => a.userId === nurse.id)).toMatchObject({ failedAttempts: checked, heldAttempts: 30 - checked, places: 30 });
    const [otherOrg] = Object.values(await orgIdsByName(["Millbrook Surgery"]));
    expect((await accountsUnderAttack({ organisationIds: [otherOrg!] })).find((a) => a.userId === nurse.id)).toBeUndefined();
  });
});

describe("the real user during an attack", () => {
  it("signs in at once from a browser that has signed in before (known-device cookie)", async () => {
    const nurse = await victim();
    const first = await fullSignIn(nurse);
    expect(first.status).toBe(200);
    const device = cookieNamed(first.setCookies, "known_device");
    expect(device).toMatch(/known_device=/);
    for (let i = 0; i < 12; i++) await attempt(nurse.email, `guess-${i}`);
    expect((await throttleOf(nurse.email)).blockedUntil!.getTime()).toBeGreaterThan(Date.now());
    // A stranger is held back; the owner's own browser is not.
    expect((await attempt(nurse.email, nurse.password)).status).toBe(429);
    const own = await fullSignIn(nurse, { cookie: device });
    expect(own.status).toBe(200);
    expect((await call(me, "/api/me", { cookie: cookieNamed(own.setCookies, "session_token") })).status).toBe(200);
    // The full sign-in ended the run of failures.
    expect(await throttleOf(nurse.email)).toMatchObject({ consecutiveFailures: 0, blockedUntil: null });
  });

  // Forty password checks: slow on a loaded machine, so its own time limit.
  it("elsewhere waits at most 15 minutes, then signs in with the right password", { timeout: 180_000 }, async () => {
    const nurse = await victim();
    for (let i = 0; i < 40; i++) {
      await attempt(nurse.email, `guess-${i}`);
      await endHold(nurse.email); // every guess gets checked, as if the attacker waited each time
    }
    const row = await throttleOf(nurse.email);
    expect(row.consecutiveFailures).toBe(40);
    await attempt(nurse.email, "one-more-guess");
    const held = await attempt(nurse.email, nurse.password);
    expect(held.status).toBe(429);
    // The longest wait a stranger can impose, however many failures: 15 minutes.
    expect(held.retryAfter).toBeLessThanOrEqual(ACCOUNT_LIMITS.maxDelaySeconds);
    expect(held.retryAfter).toBeGreaterThan(ACCOUNT_LIMITS.maxDelaySeconds - 30);
    await endHold(nurse.email);
    expect((await attempt(nurse.email, nurse.password)).status).toBe(200);
  });

  it("can reset the password by e-mail while held back, which ends the hold", async () => {
    const nurse = await victim();
    for (let i = 0; i < 8; i++) {
      await attempt(nurse.email, `guess-${i}`);
      await endHold(nurse.email);
    }
    await attempt(nurse.email, "guess-last");
    expect((await attempt(nurse.email, nurse.password)).status).toBe(429);
    const asked = await authPost(request("/api/auth/request-password-reset", { body: { email: nurse.email, redirectTo: "/en/reset-password" }, headers: { [CLIENT_ADDRESS_HEADER]: "10.49.0.1" } }));
    expect(asked.status).toBe(200);
    const [mail] = await db.select().from(outboundMessages).where(and(eq(outboundMessages.kind, "password-reset"), eq(outboundMessages.toAddress, nurse.email)));
    const token = mail.text.match(/\/reset-password\/([A-Za-z0-9_-]+)/)![1]!;
    const newPassword = "Testwick-after-attack-2026";
    const reset = await authPost(request("/api/auth/reset-password", { body: { token, newPassword }, headers: { [CLIENT_ADDRESS_HEADER]: "10.49.0.2" } }));
    expect(reset.status).toBe(200);
    // Checked at once — and the reset did not skip the second step (ASVS 6.4.3).
    const after = await attempt(nurse.email, newPassword);
    expect(after.status).toBe(200);
    expect(after.body).toMatchObject({ twoFactorRedirect: true });
  });
});

describe("what a stranger learns", () => {
  it("an e-mail address with no account is slowed exactly like one with an account (nothing to enumerate)", async () => {
    const nurse = await victim();
    const ghost = `ghost.${nurse.email}`;
    const real: number[] = [];
    const none: number[] = [];
    const both = async (i: number) => {
      real.push((await attempt(nurse.email, `guess-${i}`)).status);
      none.push((await attempt(ghost, `guess-${i}`)).status);
    };
    // Five wrong passwords each: both checked, both now held back.
    for (let i = 0; i < 5; i++) await both(i);
    expect([(await throttleOf(nurse.email)).blockedUntil, (await throttleOf(ghost)).blockedUntil].every((d) => d && d.getTime() > Date.now() - 60_000)).toBe(true);
    // Within the hold (made to last, so a slow machine cannot outlive it): both refused unchecked.
    for (const email of [nurse.email, ghost]) {
      await db.update(signInThrottles).set({ blockedUntil: new Date(Date.now() + 60_000) }).where(eq(signInThrottles.accountKey, accountKey(email)));
    }
    await both(5);
    // Once the hold is over: both checked again.
    await endHold(nurse.email);
    await endHold(ghost);
    await both(6);
    expect(real).toEqual([401, 401, 401, 401, 401, 429, 401]);
    expect(none).toEqual(real);
    expect(await throttleOf(ghost)).toMatchObject({ userId: null, consecutiveFailures: 6 });
    // No e-mail can go to an address with no account; its failures are still audited.
    expect(await db.select().from(outboundMessages).where(eq(outboundMessages.toAddress, ghost))).toHaveLength(0);
  });

  it("another account's known-device cookie is no way round the hold", async () => {
    const owner = await victim();
    const target = await victim();
    const device = cookieNamed((await fullSignIn(owner)).setCookies, "known_device");
    for (let i = 0; i < 6; i++) await attempt(target.email, `guess-${i}`);
    expect((await attempt(target.email, target.password, { cookie: device })).status).toBe(429);
  });

  it("a known device that keeps failing loses its pass", async () => {
    const nurse = await victim();
    const device = cookieNamed((await fullSignIn(nurse)).setCookies, "known_device");
    expect(device).toMatch(/known_device=/);
    // Someone at the owner's own computer guesses: the device's own count (10 an hour) stops it.
    const statuses: number[] = [];
    for (let i = 0; i < ACCOUNT_LIMITS.knownDeviceMaxFailures + 2; i++) {
      statuses.push((await attempt(nurse.email, `guess-${i}`, { cookie: device })).status);
    }
    expect(statuses.slice(0, ACCOUNT_LIMITS.knownDeviceMaxFailures)).toEqual(Array(ACCOUNT_LIMITS.knownDeviceMaxFailures).fill(401));
    expect(statuses.at(-1)).toBe(429);
  });
});
