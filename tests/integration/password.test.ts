// Password rules and changes: reset by a one-hour link (single use, sessions ended, common
// passwords refused) and change with re-authentication (ASVS 6.2.1, 6.2.4, 7.5.1).
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { GET as me } from "@/app/api/me/route";
import { db } from "@/db";
import { auditEvents, outboundMessages, patients, user, verification } from "@/db/schema";
import { call, request, signIn } from "../support/http";
import { createOrganisation, createStaff } from "../support/staff";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

/** Reset e-mails queued in the outbox for an address (no worker runs in integration tests). */
async function resetMails(email: string) {
  return db.select().from(outboundMessages).where(and(eq(outboundMessages.kind, "password-reset"), eq(outboundMessages.toAddress, email)));
}
const linkIn = (text: string) => text.match(/https?:\/\/\S+\/api\/auth\/reset-password\/\S+/)![0];

let ip = 1;
const headers = () => ({ [CLIENT_ADDRESS_HEADER]: `10.95.0.${ip++}` });

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
    // Through the outbox: one message, to the known address only, its link blanked once sent.
    expect(await resetMails("nobody@testwick.example")).toHaveLength(0);
    const [mail] = await resetMails(nurse.email);
    expect(mail).toMatchObject({ status: "queued", redactAfterSend: true, locale: "en", patientId: null, subject: "Reset your Caddis password" });
    const url = new URL(linkIn(mail.text));
    expect(url.searchParams.get("callbackURL")).toBe("/en/reset-password");
    expect(mail.html).toContain(url.pathname);
    const token = url.pathname.split("/").pop()!;
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

describe("reset e-mail language", () => {
  it("staff get it in their organisation's language, patients in their own preferred language", async () => {
    const org = await createOrganisation({ locale: "ro" });
    const nurse = await createStaff({ role: "clinician", organisationIds: [org.id] });
    await authPost(request("/api/auth/request-password-reset", { body: { email: nurse.email, redirectTo: "/en/reset-password" }, headers: headers() }));
    const [staffMail] = await resetMails(nurse.email);
    expect(staffMail).toMatchObject({ locale: "ro", subject: "Resetați parola Caddis", patientId: null });
    expect(new URL(linkIn(staffMail.text)).searchParams.get("callbackURL")).toBe("/ro/reset-password");

    // Yusuf Haddad reads Arabic: his e-mail is in Arabic, right to left, and part of his record.
    const yusuf = "yusuf.haddad@eastmere.example";
    await authPost(request("/api/auth/request-password-reset", { body: { email: yusuf, redirectTo: "/en/reset-password" }, headers: headers() }));
    const [patientMail] = await resetMails(yusuf);
    const [{ patientId }] = await db.select({ patientId: patients.id }).from(patients).innerJoin(user, eq(user.id, patients.userId)).where(eq(user.email, yusuf));
    expect(patientMail).toMatchObject({ locale: "ar", subject: "إعادة تعيين كلمة مرور Caddis", patientId });
    expect(patientMail.html).toContain('dir="rtl"');
    // Patient-facing e-mails carry the general-information words.
    expect(patientMail.text).toContain("يقدّم Caddis معلومات عامة وليس تشخيصًا");
    expect(new URL(linkIn(patientMail.text)).searchParams.get("callbackURL")).toBe("/ar/reset-password");
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
