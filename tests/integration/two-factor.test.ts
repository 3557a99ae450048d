// Two-step sign-in with TOTP (better-auth twoFactor): the demo admin signs in with a code computed
// here from the secret the seed prints; wrong codes and a password alone get no session; backup
// codes work once; an organisation can require two-step sign-in of its staff.
import { and, eq } from "drizzle-orm";
import * as OTPAuth from "otpauth";
import { describe, expect, it } from "vitest";
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { GET as me } from "@/app/api/me/route";
import { GET as caseload } from "@/app/api/caseload/route";
import { PATCH as orgPatch } from "@/app/api/admin/organisations/[organisationId]/route";
import { db } from "@/db";
import { DEMO_ADMIN_TOTP } from "@/db/seed";
import { auditEvents, memberships, organisations, twoFactor, user } from "@/db/schema";
import { call, demo, request, sessionFor, signIn, totpCode } from "../support/http";
import { createOrganisation, createStaff } from "../support/staff";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

let ip = 1;
function firstStep(email: string, password: string) {
  const headers = { [CLIENT_ADDRESS_HEADER]: `10.96.0.${ip++}` };
  return authPost(request("/api/auth/sign-in/email", { body: { email, password }, headers })).then(async (res) => ({
    res,
    headers,
    cookie: res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; "),
    body: await res.json(),
  }));
}

describe("two-step sign-in (TOTP)", () => {
  it("the seed's base32 secret is the key better-auth holds", () => {
    expect(OTPAuth.Secret.fromBase32(DEMO_ADMIN_TOTP.base32).bytes).toEqual(new TextEncoder().encode(DEMO_ADMIN_TOTP.key));
  });

  it("the demo admin's password alone gives no session; the TOTP code from the demo secret does", async () => {
    const step = await firstStep(demo.admin.email, demo.admin.password);
    expect(step.res.status).toBe(200);
    expect(step.body).toMatchObject({ twoFactorRedirect: true, twoFactorMethods: ["totp"] });
    expect(step.cookie).not.toMatch(/session_token=[^;]+\./);
    expect((await call(me, "/api/me", { cookie: step.cookie })).status).toBe(401);

    const wrong = await authPost(request("/api/auth/two-factor/verify-totp", { body: { code: "000000" }, cookie: step.cookie, headers: step.headers }));
    // A fixed wrong code could, once in a million, be right; the computed one is checked below.
    if (totpCode(DEMO_ADMIN_TOTP.base32) !== "000000") expect(wrong.status).toBe(401);

    const ok = await authPost(
      request("/api/auth/two-factor/verify-totp", { body: { code: totpCode(DEMO_ADMIN_TOTP.base32) }, cookie: step.cookie, headers: step.headers }),
    );
    expect(ok.status).toBe(200);
    const cookie = ok.headers.getSetCookie().map((c) => c.split(";")[0]).filter((c) => c.includes("session_token")).join("; ");
    const who = await call(me, "/api/me", { cookie });
    expect(who.status).toBe(200);
    expect((await who.json()).role).toBe("admin");
  });

  it("a backup code signs in once", async () => {
    const code = DEMO_ADMIN_TOTP.backupCodes[9];
    const step = await firstStep(demo.admin.email, demo.admin.password);
    const ok = await authPost(request("/api/auth/two-factor/verify-backup-code", { body: { code }, cookie: step.cookie, headers: step.headers }));
    expect(ok.status).toBe(200);
    const again = await firstStep(demo.admin.email, demo.admin.password);
    const reuse = await authPost(request("/api/auth/two-factor/verify-backup-code", { body: { code }, cookie: again.cookie, headers: again.headers }));
    expect(reuse.status).toBe(401);
  });

  it("stores the TOTP secret encrypted, never in plain text", async () => {
    const [row] = await db.select().from(twoFactor).innerJoin(user, eq(user.id, twoFactor.userId)).where(eq(user.email, demo.admin.email));
    expect(row.two_factor.secret).not.toContain(DEMO_ADMIN_TOTP.key);
    expect(row.two_factor.secret).not.toContain(DEMO_ADMIN_TOTP.base32);
    expect(row.two_factor.backupCodes).not.toContain(DEMO_ADMIN_TOTP.backupCodes[0]);
  });
});

describe("two-step sign-in for staff, by default", () => {
  it("a demo clinician's password alone gives no session; the code from the seed's secret does (ASVS 6.3.3)", async () => {
    for (const who of ["wardNurse", "communityNurse", "rowanNurse"] as const) {
      const step = await firstStep(demo[who].email, demo[who].password);
      expect(step.body).toMatchObject({ twoFactorRedirect: true, twoFactorMethods: ["totp"] });
      expect(step.body).not.toHaveProperty("token");
      expect((await call(me, "/api/me", { cookie: step.cookie })).status).toBe(401);
      expect((await call(caseload, "/api/caseload", { cookie: step.cookie })).status).toBe(401);
    }
    const cookie = await signIn(demo.wardNurse.email, demo.wardNurse.password);
    expect((await call(caseload, "/api/caseload", { cookie })).status).toBe(200);
  });

  it("a member of staff who has not set it up reaches nothing but the set-up, in any organisation that has not relaxed it, or in none", async () => {
    const org = await createOrganisation();
    for (const organisationIds of [[org.id], []]) {
      const nurse = await createStaff({ role: "clinician", organisationIds, twoFactor: false });
      const cookie = await signIn(nurse.email, nurse.password);
      const refused = await call(caseload, "/api/caseload", { cookie });
      expect(refused.status).toBe(403);
      expect((await refused.json()).error.code).toBe("two_factor_required");
    }
  });

  it("an admin relaxes it for an organisation only with a reason, which is on record and in the access log", async () => {
    const admin = await sessionFor("admin");
    const org = await createOrganisation({ name: `Relaxed Ward ${Math.random().toString(36).slice(2, 8)}` });
    const adminId = (await db.select({ id: user.id }).from(user).where(eq(user.email, demo.admin.email)))[0].id;
    await db.insert(memberships).values({ userId: adminId, organisationId: org.id });
    const nurse = await createStaff({ role: "clinician", organisationIds: [org.id], twoFactor: false });
    const patch = (body: unknown) => call(orgPatch, `/api/admin/organisations/${org.id}`, { method: "PATCH", cookie: admin, params: { organisationId: org.id }, body });

    const noReason = await patch({ requireTwoFactor: false });
    expect(noReason.status).toBe(400);
    expect((await noReason.json()).error.fields).toEqual({ twoFactorRelaxedReason: ["reason_required"] });
    expect((await patch({ requireTwoFactor: false, twoFactorRelaxedReason: "short" })).status).toBe(400);
    const [still] = await db.select().from(organisations).where(eq(organisations.id, org.id));
    expect(still.requireTwoFactor).toBe(true);

    const reason = "Shared ward tablet without phones; reviewed by the clinical safety officer.";
    const ok = await patch({ requireTwoFactor: false, twoFactorRelaxedReason: reason });
    expect(ok.status).toBe(200);
    expect((await ok.json()).organisation).toMatchObject({ requireTwoFactor: false, twoFactorRelaxedReason: reason, twoFactorRelaxedByName: "Morgan Hale" });
    const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "admin.organisation.two_factor_relaxed"), eq(auditEvents.organisationId, org.id)));
    expect(event).toMatchObject({ actorUserId: adminId, reason });

    // Its nurse now signs in with a password alone…
    const cookie = await signIn(nurse.email, nurse.password);
    expect((await call(caseload, "/api/caseload", { cookie })).status).toBe(200);
    // …unless they also belong to an organisation that requires it.
    const strict = await createOrganisation();
    const both = await createStaff({ role: "clinician", organisationIds: [org.id, strict.id], twoFactor: false });
    expect((await call(caseload, "/api/caseload", { cookie: await signIn(both.email, both.password) })).status).toBe(403);

    // Requiring it again clears the record and is in the log too.
    expect((await patch({ requireTwoFactor: true })).status).toBe(200);
    const [after] = await db.select().from(organisations).where(eq(organisations.id, org.id));
    expect(after).toMatchObject({ requireTwoFactor: true, twoFactorRelaxedReason: null, twoFactorRelaxedByUserId: null });
    expect(await db.select().from(auditEvents).where(and(eq(auditEvents.action, "admin.organisation.two_factor_required"), eq(auditEvents.organisationId, org.id)))).toHaveLength(1);
    expect((await call(caseload, "/api/caseload", { cookie })).status).toBe(403);
  });

  it("the database refuses an organisation without two-step sign-in and without a reason", async () => {
    const org = await createOrganisation();
    await expect(db.update(organisations).set({ requireTwoFactor: false }).where(eq(organisations.id, org.id))).rejects.toThrow();
  });

  it("a member of staff sets it up through better-auth and cannot turn it off", async () => {
    const org = await createOrganisation();
    const nurse = await createStaff({ role: "clinician", organisationIds: [org.id], twoFactor: false });
    const cookie = await signIn(nurse.email, nurse.password);
    // Set-up through better-auth: enable (with the password) gives the otpauth URI, a code confirms it.
    const headers = { [CLIENT_ADDRESS_HEADER]: "10.96.1.1" };
    const enable = await authPost(request("/api/auth/two-factor/enable", { body: { password: nurse.password }, cookie, headers }));
    expect(enable.status).toBe(200);
    const { totpURI, backupCodes } = await enable.json();
    expect(backupCodes).toHaveLength(10);
    const secret = new URL(totpURI).searchParams.get("secret")!;
    const verify = await authPost(request("/api/auth/two-factor/verify-totp", { body: { code: totpCode(secret) }, cookie, headers }));
    expect(verify.status).toBe(200);
    const newCookie = verify.headers.getSetCookie().map((c) => c.split(";")[0]).filter((c) => c.includes("session_token")).join("; ");
    expect((await call(caseload, "/api/caseload", { cookie: newCookie })).status).toBe(200);
    const [enabledEvent] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "account.two_factor_enable"), eq(auditEvents.actorUserId, nurse.id)));
    expect(enabledEvent).toBeTruthy();

    const disable = await authPost(request("/api/auth/two-factor/disable", { body: { password: nurse.password }, cookie: newCookie, headers: { [CLIENT_ADDRESS_HEADER]: "10.96.1.2" } }));
    expect(disable.status).toBe(403);
    const [u] = await db.select({ on: user.twoFactorEnabled }).from(user).where(eq(user.id, nurse.id));
    expect(u.on).toBe(true);

    // Next sign-in asks for the code too.
    await expect(signIn(nurse.email, nurse.password, "10.96.1.3", secret)).resolves.toMatch(/session_token/);
  });
});

describe("patients and carers", () => {
  it("may turn two-step sign-in on, and off again", async () => {
    const cookie = await signIn(demo.patientAr.email, demo.patientAr.password);
    const headers = { [CLIENT_ADDRESS_HEADER]: "10.96.2.1" };
    const enable = await authPost(request("/api/auth/two-factor/enable", { body: { password: demo.patientAr.password }, cookie, headers }));
    expect(enable.status).toBe(200);
    const secret = new URL((await enable.json()).totpURI).searchParams.get("secret")!;
    const verify = await authPost(request("/api/auth/two-factor/verify-totp", { body: { code: totpCode(secret) }, cookie, headers }));
    expect(verify.status).toBe(200);
    // The next sign-in asks for the code.
    const step = await firstStep(demo.patientAr.email, demo.patientAr.password);
    expect(step.body).toMatchObject({ twoFactorRedirect: true });
    const withCode = await signIn(demo.patientAr.email, demo.patientAr.password, "10.96.2.2", secret);
    const off = await authPost(request("/api/auth/two-factor/disable", { body: { password: demo.patientAr.password }, cookie: withCode, headers: { [CLIENT_ADDRESS_HEADER]: "10.96.2.3" } }));
    expect(off.status).toBe(200);
    expect((await firstStep(demo.patientAr.email, demo.patientAr.password)).body).not.toHaveProperty("twoFactorRedirect");
  });
});
