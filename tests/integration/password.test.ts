// Password rules and changes: reset by a one-hour link (single use, sessions ended, common
// passwords refused) and change with re-authentication (ASVS 6.2.1, 6.2.4, 7.5.1).
import { eq } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { GET as me } from "@/app/api/me/route";
import { db } from "@/db";
import { auditEvents, verification } from "@/db/schema";
import { call, request, signIn } from "../support/http";
import { createOrganisation, createStaff } from "../support/staff";

// The reset e-mail goes through the outbox once it is merged; here the link is caught instead.
const sent: { email: string; url: string }[] = [];
vi.mock("@/lib/admin/mail", async (original) => ({
  ...(await original<typeof import("@/lib/admin/mail")>()),
  sendPasswordReset: async (m: { email: string; url: string }) => {
    sent.push({ email: m.email, url: m.url });
  },
}));

let ip = 1;
const headers = () => ({ "x-forwarded-for": `10.95.0.${ip++}` });

describe("password reset by e-mail link", () => {
  it("sends a link for a known address only, the same answer either way; the link sets a new password once and ends every session", async () => {
    const org = await createOrganisation();
    const nurse = await createStaff({ role: "clinician", organisationIds: [org.id] });
    const oldCookie = await signIn(nurse.email, nurse.password);

    const unknown = await authPost(request("/api/auth/request-password-reset", { body: { email: "nobody@testwick.example", redirectTo: "/en/reset-password" }, headers: headers() }));
    const known = await authPost(request("/api/auth/request-password-reset", { body: { email: nurse.email, redirectTo: "/en/reset-password" }, headers: headers() }));
    expect(unknown.status).toBe(200);
    expect(known.status).toBe(200);
    expect(await unknown.json()).toEqual(await known.json());
    expect(sent.map((s) => s.email)).toEqual([nurse.email]);
    const token = new URL(sent[0].url).pathname.split("/").pop()!;
    // Only a hash of the token is stored.
    const rows = await db.select({ identifier: verification.identifier }).from(verification);
    expect(rows.some((r) => r.identifier.includes(token))).toBe(false);

    const common = await authPost(request("/api/auth/reset-password", { body: { token, newPassword: "passwordpassword" }, headers: headers() }));
    expect(common.status).toBe(400);
    expect((await common.json()).code).toBe("PASSWORD_TOO_COMMON");
    const short = await authPost(request("/api/auth/reset-password", { body: { token, newPassword: "short-one" }, headers: headers() }));
    expect(short.status).toBe(400);

    const ok = await authPost(request("/api/auth/reset-password", { body: { token, newPassword: "Testwick-new-pass-2026" }, headers: headers() }));
    expect(ok.status).toBe(200);
    expect((await call(me, "/api/me", { cookie: oldCookie })).status).toBe(401);
    await expect(signIn(nurse.email, nurse.password)).rejects.toThrow(/401/);
    expect(await signIn(nurse.email, "Testwick-new-pass-2026")).toMatch(/session_token/);
    const again = await authPost(request("/api/auth/reset-password", { body: { token, newPassword: "Testwick-other-pass-2026" }, headers: headers() }));
    expect(again.status).toBe(400);
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "account.password_reset"));
    expect(event.actorUserId).toBe(nurse.id);
  });
});

describe("changing the password", () => {
  it("needs the current password, refuses common ones, and signs out other sessions", async () => {
    const org = await createOrganisation();
    const nurse = await createStaff({ role: "clinician", organisationIds: [org.id] });
    const here = await signIn(nurse.email, nurse.password);
    const elsewhere = await signIn(nurse.email, nurse.password);
    const wrong = await authPost(
      request("/api/auth/change-password", { body: { currentPassword: "not-my-password-1", newPassword: "Testwick-changed-2026" }, cookie: here, headers: headers() }),
    );
    expect(wrong.status).toBe(400);
    const common = await authPost(
      request("/api/auth/change-password", { body: { currentPassword: nurse.password, newPassword: "qwerty123456" }, cookie: here, headers: headers() }),
    );
    expect(common.status).toBe(400);
    const ok = await authPost(
      request("/api/auth/change-password", {
        body: { currentPassword: nurse.password, newPassword: "Testwick-changed-2026", revokeOtherSessions: true },
        cookie: here,
        headers: headers(),
      }),
    );
    expect(ok.status).toBe(200);
    expect((await call(me, "/api/me", { cookie: elsewhere })).status).toBe(401);
    expect(await signIn(nurse.email, "Testwick-changed-2026")).toMatch(/session_token/);
    const events = await db.select().from(auditEvents).where(eq(auditEvents.action, "account.password_change"));
    expect(events.map((e) => e.actorUserId)).toContain(nurse.id);
  });
});
