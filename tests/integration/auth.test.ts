import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { POST as authPost, GET as authGet } from "@/app/api/auth/[...all]/route";
import { GET as me } from "@/app/api/me/route";
import { db } from "@/db";
import { session, user } from "@/db/schema";
import { SIGN_IN_MAX_ATTEMPTS } from "@/lib/auth";
import { call, demo, request, sessionFor, signIn } from "../support/http";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

describe("sign-in with better-auth on PostgreSQL", () => {
  it.each(Object.keys(demo) as (keyof typeof demo)[])("demo account %s signs in and is known to the API", async (who) => {
    const cookie = await sessionFor(who);
    const res = await call(me, "/api/me", { cookie });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.email).toBe(demo[who].email);
    expect(body.home).toMatch(/^\/(admin|caseload|today)$/);
    expect(body).not.toHaveProperty("password");
  });

  it("stores sessions in PostgreSQL and ends them on sign-out (ASVS 7.4.1)", async () => {
    const cookie = await signIn(demo.wardNurse.email, demo.wardNurse.password);
    const [u] = await db.select({ id: user.id }).from(user).where(eq(user.email, demo.wardNurse.email));
    const before = await db.select().from(session).where(eq(session.userId, u.id));
    expect(before.length).toBeGreaterThan(0);
    const out = await authPost(request("/api/auth/sign-out", { body: {}, cookie }));
    expect(out.status).toBe(200);
    expect((await call(me, "/api/me", { cookie })).status).toBe(401);
  });

  it("refuses a wrong password without saying which part was wrong", async () => {
    const res = await authPost(
      request("/api/auth/sign-in/email", {
        body: { email: demo.patient.email, password: "not-the-password-1" },
        headers: { [CLIENT_ADDRESS_HEADER]: "10.98.0.1" },
      }),
    );
    expect(res.status).toBe(401);
    expect(await res.text()).not.toMatch(/password is wrong|no such user/i);
  });

  it("rate-limits sign-in attempts from one address (ASVS 2.4.1, 6.3.1)", { timeout: 120_000 }, async () => {
    const ip = "10.97.0.1";
    const statuses: number[] = [];
    for (let i = 0; i < SIGN_IN_MAX_ATTEMPTS + 2; i++) {
      // A different account each time (the per-account limit is tests/integration/sign-in-throttle.test.ts).
      const res = await authPost(
        request("/api/auth/sign-in/email", {
          body: { email: `nobody.${i}@testwick.example`, password: `wrong-password-${i}` },
          headers: { [CLIENT_ADDRESS_HEADER]: ip },
        }),
      );
      statuses.push(res.status);
    }
    expect(statuses.slice(0, SIGN_IN_MAX_ATTEMPTS).every((s) => s === 401)).toBe(true);
    expect(statuses.at(-1)).toBe(429);
    // Another address is not locked out, so the limit cannot be used to lock a person out.
    const cookie = await signIn(demo.carer.email, demo.carer.password, "10.97.0.2");
    expect(cookie).toMatch(/session_token/);
  });

  it("refuses sign-up: accounts are made by staff and invitations only", async () => {
    const res = await authPost(
      request("/api/auth/sign-up/email", { body: { email: "someone@eastmere.example", password: "a-long-password-123", name: "X" } }),
    );
    expect(res.status).toBeGreaterThanOrEqual(400);
    const rows = await db.select().from(user).where(eq(user.email, "someone@eastmere.example"));
    expect(rows).toHaveLength(0);
  });

  it("refuses a deactivated account: no new session, and its existing session stops working (ASVS 7.4.2)", async () => {
    const cookie = await signIn(demo.rowanNurse.email, demo.rowanNurse.password);
    expect((await call(me, "/api/me", { cookie })).status).toBe(200);
    await db.update(user).set({ deactivatedAt: new Date() }).where(eq(user.email, demo.rowanNurse.email));
    try {
      expect((await call(me, "/api/me", { cookie })).status).toBe(401);
      await expect(signIn(demo.rowanNurse.email, demo.rowanNurse.password)).rejects.toThrow(/403/);
    } finally {
      await db.update(user).set({ deactivatedAt: null }).where(eq(user.email, demo.rowanNurse.email));
    }
  });

  it("exposes better-auth's session endpoint without password hashes", async () => {
    const cookie = await sessionFor("patient");
    const res = await authGet(request("/api/auth/get-session", { cookie }));
    const text = await res.text();
    expect(res.status).toBe(200);
    expect(text).toContain(demo.patient.email);
    expect(text).not.toMatch(/scrypt\$/);
  });
});
