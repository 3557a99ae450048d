// Staff administration: invitations (72 h, hashed token), acceptance with the password rules,
// memberships and roles, deactivation that ends sessions at once (ASVS 7.4.2), reactivation, and
// the last-admin rule held in a transaction, also under concurrent changes.
import { and, eq, inArray } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as staffList } from "@/app/api/admin/staff/route";
import { POST as invite } from "@/app/api/admin/staff/invitations/route";
import { DELETE as withdraw } from "@/app/api/admin/staff/invitations/[invitationId]/route";
import { GET as staffGet, PATCH as staffPatch } from "@/app/api/admin/staff/[userId]/route";
import { POST as deactivate } from "@/app/api/admin/staff/[userId]/deactivate/route";
import { POST as reactivate } from "@/app/api/admin/staff/[userId]/reactivate/route";
import { POST as accept } from "@/app/api/staff-invitations/accept/route";
import { POST as createOrg } from "@/app/api/admin/organisations/route";
import { GET as me } from "@/app/api/me/route";
import { GET as caseload } from "@/app/api/caseload/route";
import { db } from "@/db";
import { auditEvents, memberships, session, staffInvitations, user } from "@/db/schema";
import { hashToken } from "@/lib/admin/tokens";
import { call, demo, sessionFor, signIn, enrolTotpOverApi } from "../support/http";
import { createOrganisation, createStaff, invitationLink, invitationMessage, orgIdsByName, suffix, testPassword, tokenOf, userIdByEmail } from "../support/staff";

let adminCookie: string;
let orgs: Record<string, string>;
let morganId: string;

beforeAll(async () => {
  adminCookie = await sessionFor("admin");
  orgs = await orgIdsByName(["Larch Ward", "Rowan Ward", "Harbourside Community Nursing Team", "Millbrook Surgery"]);
  morganId = await userIdByEmail(demo.admin.email);
});

async function inviteAndAccept({ role, organisationIds, cookie = adminCookie }: { role: "admin" | "clinician"; organisationIds: string[]; cookie?: string }) {
  const email = `invitee.${suffix()}@testwick.example`;
  const res = await call(invite, "/api/admin/staff/invitations", { cookie, body: { email, role, organisationIds } });
  expect(res.status).toBe(201);
  const body = await res.json();
  const token = tokenOf(await invitationLink(body.invitation.id));
  const ok = await call(accept, "/api/staff-invitations/accept", { body: { token, name: "Testwick Invitee", password: testPassword } });
  expect(ok.status).toBe(201);
  // Staff sign in in two steps: set it up at the first sign-in, as the set-up page does.
  const { cookie: signedIn } = await enrolTotpOverApi(await signIn(email, testPassword), testPassword, email);
  return { email, id: await userIdByEmail(email), cookie: signedIn };
}

describe("invitations", () => {
  it("invites a nurse with a 72-hour link whose token is stored only as a hash, then the nurse accepts and signs in", async () => {
    const email = `new.nurse.${suffix()}@testwick.example`;
    const res = await call(invite, "/api/admin/staff/invitations", {
      cookie: adminCookie,
      body: { email, name: "Ines Varga", role: "clinician", organisationIds: [orgs["Larch Ward"]] },
    });
    expect(res.status).toBe(201);
    const body = await res.json();
    // The link is e-mailed, never shown to the admin.
    expect(body.emailed).toBe(true);
    expect(JSON.stringify(body)).not.toMatch(/accept-invite/);
    const message = await invitationMessage(body.invitation.id);
    expect(message).toMatchObject({ toAddress: email, status: "queued", redactAfterSend: true, locale: "en", patientId: null });
    expect(message.subject).toBe("You are invited to Caddis");
    const link = await invitationLink(body.invitation.id);
    expect(link).toMatch(/\/en\/accept-invite\/[A-Za-z0-9_-]{43}$/);
    expect(message.html).toContain(link);
    const token = tokenOf(link);
    // 256 bits of randomness (43 base64url characters), kept only as its SHA-256.
    expect(Buffer.from(token, "base64url").length).toBe(32);
    const [row] = await db.select().from(staffInvitations).where(eq(staffInvitations.id, body.invitation.id));
    expect(row.tokenHash).toBe(hashToken(token));
    expect(JSON.stringify(row)).not.toContain(token);
    const hours = (row.expiresAt.getTime() - row.createdAt.getTime()) / 3600_000;
    expect(hours).toBeGreaterThan(71.9);
    expect(hours).toBeLessThan(72.1);

    const pending = await (await call(staffList, "/api/admin/staff", { cookie: adminCookie })).json();
    expect(pending.invitations.map((i: { email: string }) => i.email)).toContain(email);

    // Password rules: too short and too common are refused with field errors, nothing written.
    for (const [password, code] of [["short-pass", "password_too_short"], ["passwordpassword", "password_too_common"]]) {
      const bad = await call(accept, "/api/staff-invitations/accept", { body: { token, name: "Ines Varga", password } });
      expect(bad.status).toBe(400);
      expect((await bad.json()).error.fields.password).toEqual([code]);
    }
    expect(await db.select().from(user).where(eq(user.email, email))).toHaveLength(0);

    const ok = await call(accept, "/api/staff-invitations/accept", { body: { token, name: "Ines Varga", password: testPassword } });
    expect(ok.status).toBe(201);
    const first = await signIn(email, testPassword);
    const who = await (await call(me, "/api/me", { cookie: first })).json();
    expect(who).toMatchObject({ email, role: "clinician", name: "Ines Varga", home: "/caseload" });
    // Like all staff she signs in in two steps: nothing but the set-up until it is done.
    expect((await call(caseload, "/api/caseload", { cookie: first })).status).toBe(403);
    const { cookie } = await enrolTotpOverApi(first, testPassword);
    const team = await (await call(caseload, "/api/caseload", { cookie })).json();
    expect(team.rows.map((r: { name: string }) => r.name)).toEqual(["Maria Popescu"]);

    // The link works once.
    const again = await call(accept, "/api/staff-invitations/accept", { body: { token, name: "Someone Else", password: testPassword } });
    expect(again.status).toBe(404);
    const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "admin.staff.invite"), eq(auditEvents.actorUserId, morganId)));
    expect(event).toBeTruthy();
  });

  it("refuses an expired or withdrawn link, an unknown token, and an address that has an account", async () => {
    const email = `late.${suffix()}@testwick.example`;
    const body = await (
      await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email, role: "clinician", organisationIds: [orgs["Rowan Ward"]] } })
    ).json();
    const token = tokenOf(await invitationLink(body.invitation.id));
    await db
      .update(staffInvitations)
      .set({ createdAt: new Date(Date.now() - 80 * 3600_000), expiresAt: new Date(Date.now() - 8 * 3600_000) })
      .where(eq(staffInvitations.id, body.invitation.id));
    expect((await call(accept, "/api/staff-invitations/accept", { body: { token, name: "Late Comer", password: testPassword } })).status).toBe(404);
    // An expired invitation may be replaced by a new one; the new one can be withdrawn.
    const second = await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email, role: "clinician", organisationIds: [orgs["Rowan Ward"]] } });
    expect(second.status).toBe(201);
    const s = await second.json();
    expect((await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email, role: "clinician", organisationIds: [orgs["Rowan Ward"]] } })).status).toBe(409);
    const w = await call(withdraw, `/api/admin/staff/invitations/${s.invitation.id}`, { method: "DELETE", cookie: adminCookie, params: { invitationId: s.invitation.id } });
    expect(w.status).toBe(200);
    const t2 = tokenOf(await invitationLink(s.invitation.id));
    expect((await call(accept, "/api/staff-invitations/accept", { body: { token: t2, name: "Late Comer", password: testPassword } })).status).toBe(404);
    expect((await call(accept, "/api/staff-invitations/accept", { body: { token: "x".repeat(43), name: "Nobody Here", password: testPassword } })).status).toBe(404);

    const taken = await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email: demo.wardNurse.email, role: "clinician", organisationIds: [orgs["Larch Ward"]] } });
    expect(taken.status).toBe(409);
    expect((await taken.json()).error.fields.email).toEqual(["account_exists"]);
  });

  it("refuses bad input with every field error and writes nothing", async () => {
    const before = await db.select().from(staffInvitations);
    const res = await call(invite, "/api/admin/staff/invitations", { cookie: adminCookie, body: { email: "not-an-address", role: "surgeon", organisationIds: [] } });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(Object.keys(error.fields).sort()).toEqual(["email", "organisationIds", "role"]);
    expect(await db.select().from(staffInvitations)).toHaveLength(before.length);
  });

  it("an admin cannot invite into an organisation they do not belong to (404)", async () => {
    const res = await call(invite, "/api/admin/staff/invitations", {
      cookie: adminCookie,
      body: { email: `x.${suffix()}@testwick.example`, role: "clinician", organisationIds: [orgs["Millbrook Surgery"]] },
    });
    expect(res.status).toBe(404);
  });
});

describe("memberships, roles and deactivation", () => {
  it("changes memberships and role, each change an audit event", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [orgs["Larch Ward"]] });
    const res = await call(staffPatch, `/api/admin/staff/${nurse.id}`, {
      method: "PATCH",
      cookie: adminCookie,
      params: { userId: nurse.id },
      body: { organisationIds: [orgs["Rowan Ward"], orgs["Harbourside Community Nursing Team"]] },
    });
    expect(res.status).toBe(200);
    const { member } = await res.json();
    expect(member.organisations.map((o: { name: string }) => o.name).sort()).toEqual(["Harbourside Community Nursing Team", "Rowan Ward"]);
    const role = await call(staffPatch, `/api/admin/staff/${nurse.id}`, { method: "PATCH", cookie: adminCookie, params: { userId: nurse.id }, body: { role: "admin" } });
    expect((await role.json()).member.role).toBe("admin");
    const events = await db.select().from(auditEvents).where(eq(auditEvents.action, "admin.staff.update"));
    expect(events.filter((e) => (e.details as { userId?: string }).userId === nurse.id)).toHaveLength(2);
    // Removing every membership is refused.
    const none = await call(staffPatch, `/api/admin/staff/${nurse.id}`, { method: "PATCH", cookie: adminCookie, params: { userId: nurse.id }, body: { organisationIds: [] } });
    expect(none.status).toBe(400);
    await call(staffPatch, `/api/admin/staff/${nurse.id}`, { method: "PATCH", cookie: adminCookie, params: { userId: nurse.id }, body: { role: "clinician" } });
  });

  it("deactivating ends the account's sessions at once: its existing cookie is refused on the next request (ASVS 7.4.2)", async () => {
    const nurse = await createStaff({ role: "clinician", organisationIds: [orgs["Harbourside Community Nursing Team"]] });
    const cookie = await signIn(nurse.email, nurse.password);
    expect((await call(caseload, "/api/caseload", { cookie })).status).toBe(200);
    const res = await call(deactivate, `/api/admin/staff/${nurse.id}/deactivate`, { cookie: adminCookie, params: { userId: nurse.id }, body: {} });
    expect(res.status).toBe(200);
    expect((await res.json()).sessionsEnded).toBe(1);
    expect(await db.select().from(session).where(eq(session.userId, nurse.id))).toHaveLength(0);
    expect((await call(caseload, "/api/caseload", { cookie })).status).toBe(401);
    expect((await call(me, "/api/me", { cookie })).status).toBe(401);
    await expect(signIn(nurse.email, nurse.password)).rejects.toThrow(/403/);
    const listed = await (await call(staffGet, `/api/admin/staff/${nurse.id}`, { cookie: adminCookie, params: { userId: nurse.id } })).json();
    expect(listed.member.active).toBe(false);

    const back = await call(reactivate, `/api/admin/staff/${nurse.id}/reactivate`, { cookie: adminCookie, params: { userId: nurse.id }, body: {} });
    expect(back.status).toBe(200);
    const again = await signIn(nurse.email, nurse.password);
    expect((await call(caseload, "/api/caseload", { cookie: again })).status).toBe(200);
    const actions = (await db.select().from(auditEvents)).filter((e) => (e.details as { userId?: string }).userId === nurse.id).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["admin.staff.deactivate", "admin.staff.reactivate"]));
  });

  it("an admin cannot deactivate themselves", async () => {
    const res = await call(deactivate, `/api/admin/staff/${morganId}/deactivate`, { cookie: adminCookie, params: { userId: morganId }, body: {} });
    expect(res.status).toBe(409);
    const [u] = await db.select().from(user).where(eq(user.id, morganId));
    expect(u.deactivatedAt).toBeNull();
  });
});

describe("the last admin", () => {
  it("the only admin of the deployment cannot give up the admin role", async () => {
    const res = await call(staffPatch, `/api/admin/staff/${morganId}`, { method: "PATCH", cookie: adminCookie, params: { userId: morganId }, body: { role: "clinician" } });
    expect(res.status).toBe(409);
    expect((await res.json()).error.code).toBe("last_admin");
    const [u] = await db.select().from(user).where(eq(user.id, morganId));
    expect(u.role).toBe("admin");
  });

  it("an organisation that has admins keeps at least one: removal and deactivation are refused, and concurrent changes cannot both pass", async () => {
    // Morgan creates Zed Ward (becoming its member) and invites Tamsin as a second admin of it.
    const created = await call(createOrg, "/api/admin/organisations", {
      cookie: adminCookie,
      body: { name: `Zed Ward ${suffix()}`, kind: "hospital_ward", locale: "en", languages: ["en"], requireTwoFactor: true },
    });
    expect(created.status).toBe(201);
    const zed = (await created.json()).organisation.id as string;
    const tamsin = await inviteAndAccept({ role: "admin", organisationIds: [zed] });
    // Tamsin alone looks after a second organisation, Yew Ward.
    const yew = await createOrganisation({ name: `Yew Ward ${suffix()}` });
    await db.insert(memberships).values({ userId: tamsin.id, organisationId: yew.id });

    // Deactivating Tamsin would leave Yew Ward without an admin.
    const d = await call(deactivate, `/api/admin/staff/${tamsin.id}/deactivate`, { cookie: adminCookie, params: { userId: tamsin.id }, body: {} });
    expect(d.status).toBe(409);
    expect((await d.json()).error.message).toContain("Yew Ward");
    expect((await call(me, "/api/me", { cookie: tamsin.cookie })).status).toBe(200);

    // Morgan takes Tamsin out of Zed while Tamsin takes Morgan out of Zed: one of the two must
    // fail. The second, run under the roster lock after the first, finds its admin no longer
    // manages Zed (404).
    const [a, b] = await Promise.all([
      call(staffPatch, `/api/admin/staff/${tamsin.id}`, { method: "PATCH", cookie: adminCookie, params: { userId: tamsin.id }, body: { organisationIds: [] } }),
      call(staffPatch, `/api/admin/staff/${morganId}`, { method: "PATCH", cookie: tamsin.cookie, params: { userId: morganId }, body: { organisationIds: [] } }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 404]);
    const zedAdmins = await db
      .select({ id: memberships.userId })
      .from(memberships)
      .innerJoin(user, eq(user.id, memberships.userId))
      .where(and(eq(memberships.organisationId, zed), eq(user.role, "admin")));
    expect(zedAdmins).toHaveLength(1);
  });

  it("two admins who each step down at the same moment cannot leave their organisation without one", async () => {
    const quill = await createOrganisation({ name: `Quill Team ${suffix()}`, kind: "community_team" });
    const p1 = await createStaff({ role: "admin", organisationIds: [quill.id] });
    const p2 = await createStaff({ role: "admin", organisationIds: [quill.id] });
    const [c1, c2] = [await signIn(p1.email, p1.password), await signIn(p2.email, p2.password)];
    const results = await Promise.all([
      call(staffPatch, `/api/admin/staff/${p1.id}`, { method: "PATCH", cookie: c1, params: { userId: p1.id }, body: { role: "clinician" } }),
      call(staffPatch, `/api/admin/staff/${p2.id}`, { method: "PATCH", cookie: c2, params: { userId: p2.id }, body: { role: "clinician" } }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    const roles = await db.select({ role: user.role }).from(user).where(inArray(user.id, [p1.id, p2.id]));
    expect(roles.map((r) => r.role).sort()).toEqual(["admin", "clinician"]);
  });

  it("an admin of another organisation gets 404 for this organisation's staff", async () => {
    const elsewhere = await createOrganisation({ name: `Elsewhere Team ${suffix()}`, kind: "community_team" });
    const other = await createStaff({ role: "admin", organisationIds: [elsewhere.id] });
    const cookie = await signIn(other.email, other.password);
    const wardNurse = await userIdByEmail(demo.wardNurse.email);
    expect((await call(staffGet, `/api/admin/staff/${wardNurse}`, { cookie, params: { userId: wardNurse } })).status).toBe(404);
    expect((await call(staffPatch, `/api/admin/staff/${wardNurse}`, { method: "PATCH", cookie, params: { userId: wardNurse }, body: { role: "admin" } })).status).toBe(404);
    expect((await call(deactivate, `/api/admin/staff/${wardNurse}/deactivate`, { cookie, params: { userId: wardNurse }, body: {} })).status).toBe(404);
    expect((await call(reactivate, `/api/admin/staff/${wardNurse}/reactivate`, { cookie, params: { userId: wardNurse }, body: {} })).status).toBe(404);
    const list = await (await call(staffList, "/api/admin/staff", { cookie })).json();
    expect(list.staff.map((s: { email: string }) => s.email)).toEqual([other.email]);
    const open = await (await call(staffList, "/api/admin/staff", { cookie: adminCookie })).json();
    const someInvitation = open.invitations[0]?.id;
    if (someInvitation) {
      expect((await call(withdraw, `/api/admin/staff/invitations/${someInvitation}`, { method: "DELETE", cookie, params: { invitationId: someInvitation } })).status).toBe(404);
    }
    // Tampering with an organisation id in a membership change is refused the same way.
    const own = await createStaff({ role: "clinician", organisationIds: [elsewhere.id] });
    const tamper = await call(staffPatch, `/api/admin/staff/${own.id}`, { method: "PATCH", cookie, params: { userId: own.id }, body: { organisationIds: [orgs["Larch Ward"]] } });
    expect(tamper.status).toBe(404);
  });
});
