// Staff administration's e-mails go through the outbox: the invitation is queued in the same
// transaction as the invitation (rolled back together), in the organisation's language, never
// shown to the admin, delivered by the worker, and its link blanked from the record once sent.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { GET as staffList } from "@/app/api/admin/staff/route";
import { POST as invite } from "@/app/api/admin/staff/invitations/route";
import { POST as accept } from "@/app/api/staff-invitations/accept/route";
import { db } from "@/db";
import { outboundMessages, staffInvitations } from "@/db/schema";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { call, request, sessionFor, signIn } from "../support/http";
import { waitForEmails } from "../support/mail";
import { createOrganisation, createStaff, invitationLink, invitationMessage, suffix, testPassword, tokenOf } from "../support/staff";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

// A switch to make the invitation's transaction fail after the e-mail was queued in it.
const failAudit = vi.hoisted(() => ({ on: false }));
vi.mock("@/lib/records/audit", async (original) => {
  const real = await original<typeof import("@/lib/records/audit")>();
  return {
    ...real,
    audit: async (...args: Parameters<typeof real.audit>) => {
      if (failAudit.on && args[0].action === "admin.staff.invite") throw new Error("simulated failure after the e-mail was queued");
      return real.audit(...args);
    },
  };
});

const quiet = () => {};
let polishOrg: { id: string; name: string };
let adminCookie: string;

beforeAll(async () => {
  // A ward whose staff e-mails are in Polish, with an admin of its own.
  polishOrg = await createOrganisation({ name: `Oddział Testowy ${suffix()}`, locale: "pl" });
  const admin = await createStaff({ role: "admin", organisationIds: [polishOrg.id] });
  adminCookie = await signIn(admin.email, admin.password);
});

describe("staff invitation e-mail", () => {
  it("is written in the organisation's language and delivered; the link leaves the record once sent and works from the inbox", async () => {
    const email = `zaproszenie.${suffix()}@mail-test.example`;
    const res = await call(invite, "/api/admin/staff/invitations", {
      cookie: adminCookie,
      body: { email, name: "Ewa Kowal", role: "clinician", organisationIds: [polishOrg.id] },
    });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body).toMatchObject({ emailed: true, messageStatus: "queued", invitation: { locale: "pl" } });
    expect(JSON.stringify(body)).not.toMatch(/accept-invite/);
    const queued = await invitationMessage(body.invitation.id);
    expect(queued).toMatchObject({ locale: "pl", subject: "Zaproszenie do Caddis", toAddress: email });
    const link = await invitationLink(body.invitation.id);
    expect(link).toMatch(/\/pl\/accept-invite\//);

    // The admin's list says the e-mail is waiting, then that it went.
    const before = await (await call(staffList, "/api/admin/staff", { cookie: adminCookie })).json();
    expect(before.invitations.find((i: { id: string }) => i.id === body.invitation.id).mail).toMatchObject({ status: "queued" });

    await drainOutbox({ keyPrefix: `staff-invite:${body.invitation.id}`, log: quiet });
    const [mail] = await waitForEmails(email, 1);
    expect(mail.subject).toBe("Zaproszenie do Caddis");
    expect(mail.html).toContain('lang="pl"');
    expect(mail.text).toContain("Dzień dobry, Ewa Kowal.");
    expect(mail.text).toContain(polishOrg.name);
    const inboxLink = mail.text!.match(/https?:\/\/\S+\/accept-invite\/[A-Za-z0-9_-]+/)![0];
    expect(inboxLink).toBe(link);

    const [sent] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, queued.id));
    expect(sent).toMatchObject({ status: "sent", html: "", text: "" });
    const after = await (await call(staffList, "/api/admin/staff", { cookie: adminCookie })).json();
    expect(after.invitations.find((i: { id: string }) => i.id === body.invitation.id).mail).toMatchObject({ status: "sent" });
    expect(JSON.stringify(after)).not.toContain(tokenOf(link));

    const ok = await call(accept, "/api/staff-invitations/accept", { body: { token: tokenOf(inboxLink), name: "Ewa Kowal", password: testPassword } });
    expect(ok.status).toBe(201);
    expect(await signIn(email, testPassword)).toMatch(/session_token/);
  });

  it("is rolled back with the invitation: a failed invitation leaves no e-mail, and a good one exactly one", async () => {
    const email = `rollback.${suffix()}@mail-test.example`;
    const count = async () => (await db.select().from(outboundMessages).where(eq(outboundMessages.toAddress, email))).length;
    failAudit.on = true;
    try {
      const res = await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email, role: "clinician", organisationIds: [polishOrg.id] } });
      expect(res.status).toBe(500);
    } finally {
      failAudit.on = false;
    }
    expect(await count()).toBe(0);
    expect(await db.select().from(staffInvitations).where(eq(staffInvitations.email, email))).toHaveLength(0);
    const res = await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email, role: "clinician", organisationIds: [polishOrg.id] } });
    expect(res.status).toBe(201);
    expect(await count()).toBe(1);
  });

  it("bad input and a refused invitation queue nothing", async () => {
    const before = (await db.select().from(outboundMessages)).length;
    expect((await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email: "nope", role: "clinician", organisationIds: [polishOrg.id] } })).status).toBe(400);
    // An organisation the admin does not manage: 404, nothing queued.
    const other = await createOrganisation();
    expect(
      (await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email: `x.${suffix()}@mail-test.example`, role: "clinician", organisationIds: [other.id] } })).status,
    ).toBe(404);
    // A clinician cannot invite.
    expect(
      (await call(invite, "/api/admin/staff/invitations", { cookie: await sessionFor("communityNurse"), body: { email: `y.${suffix()}@mail-test.example`, role: "clinician", organisationIds: [polishOrg.id] } })).status,
    ).toBe(403);
    expect((await db.select().from(outboundMessages)).length).toBe(before);
  });
});

describe("password reset e-mail", () => {
  it("is delivered through the outbox in the organisation's language, and the link is blanked from the record once sent", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [polishOrg.id], email: `reset.${suffix()}@mail-test.example` });
    const res = await authPost(
      request("/api/auth/request-password-reset", { body: { email: nurse.email, redirectTo: "/en/reset-password" }, headers: { [CLIENT_ADDRESS_HEADER]: "10.96.0.1" } }),
    );
    expect(res.status).toBe(200);
    await drainOutbox({ keyPrefix: "password-reset:", log: quiet });
    const [mail] = await waitForEmails(nurse.email, 1);
    expect(mail.subject).toBe("Zresetuj hasło do Caddis");
    const link = mail.text!.match(/https?:\/\/\S+\/api\/auth\/reset-password\/\S+/)![0];
    expect(new URL(link).searchParams.get("callbackURL")).toBe("/pl/reset-password");
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.toAddress, nurse.email));
    expect(row).toMatchObject({ kind: "password-reset", status: "sent", html: "", text: "" });
    const token = new URL(link).pathname.split("/").pop()!;
    const ok = await authPost(request("/api/auth/reset-password", { body: { token, newPassword: "Testwick-reset-by-mail-2026" }, headers: { [CLIENT_ADDRESS_HEADER]: "10.96.0.2" } }));
    expect(ok.status).toBe(200);
    expect(await signIn(nurse.email, "Testwick-reset-by-mail-2026")).toMatch(/session_token/);
  });
});
