// Transfer of care (issue 22): the ward refers a patient to the community team, which accepts
// (joins the care team and leads it) or declines with a reason that goes back; an unanswered
// referral is flagged and sent again through the outbox; the care team changes afterwards; the
// lead team's numbers are the ones every contact shows. Real routes, real sessions, each refusal
// checked to write nothing.
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as postCareTeam, PATCH as patchCareTeam } from "@/app/api/patients/[patientId]/care-team/route";
import { DELETE as leaveCareTeam } from "@/app/api/patients/[patientId]/care-team/[organisationId]/route";
import { POST as postChecklist } from "@/app/api/patients/[patientId]/discharge-checklist/route";
import { POST as postPassport } from "@/app/api/patients/[patientId]/passport/route";
import { GET as listReferrals, POST as postReferral } from "@/app/api/patients/[patientId]/referrals/route";
import { POST as withdraw } from "@/app/api/patients/[patientId]/referrals/[referralId]/withdraw/route";
import { POST as createPatient } from "@/app/api/patients/route";
import { POST as accept } from "@/app/api/referrals/[referralId]/accept/route";
import { POST as decline } from "@/app/api/referrals/[referralId]/decline/route";
import { PATCH as settingsPatch } from "@/app/api/admin/settings/route";
import { GET as directory } from "@/app/api/teams/route";
import { db } from "@/db";
import { getHelpContacts, getLeadTeamContact } from "@/db/queries/contacts";
import { listCaseloadReferrals } from "@/db/queries/referrals";
import { auditEvents, careTeam, dischargeChecklists, organisations, outboundMessages, referrals, settings } from "@/db/schema";
import { sendReferralReminders } from "@/lib/email/referral-mail";
import { changedTables, snapshot } from "../support/db-snapshot";
import { grantVisitAccess, userIdByEmail } from "../support/fixtures";
import { insertEpisode } from "../support/mail";
import { call, sessionFor } from "../support/http";

let ward: string; // Tomasz Reid, Larch Ward (discharge nurse)
let community: string; // Grace Mensah, Harbourside
let rowanNurse: string; // Priya Sandhu, Rowan Ward
let admin: string;
let patientCookie: string;
const org: Record<string, string> = {};
let millbrook: string;

const checklist = {
  taught: ["emptying-bag", "changing-bags", "leg-and-night-bags", "when-to-get-help"],
  suppliesGiven: true,
  suppliesDays: 7,
  drainage: "valve",
  plannedTwocOn: "2027-01-14",
  firstVisitOn: "2026-12-05",
  portalActivationGiven: false,
  notes: "Daughter present for the teaching",
};

beforeAll(async () => {
  [ward, community, rowanNurse, admin, patientCookie] = [await sessionFor("wardNurse"), await sessionFor("communityNurse"), await sessionFor("rowanNurse"), await sessionFor("admin"), await sessionFor("patient")];
  for (const o of await db.select({ id: organisations.id, name: organisations.name }).from(organisations)) org[o.name] = o.id;
  millbrook = org["Millbrook Surgery"];
});

let hrn = 0;
async function registerOnWard() {
  hrn++;
  const res = await call(createPatient, "/api/patients", {
    cookie: ward,
    body: {
      givenName: "Edith",
      familyName: `Transfer${hrn}`,
      healthRecordNumber: `TOC-${hrn}-${Date.now() % 100000}`,
      dateOfBirth: "1938-02-11",
      sex: "female",
      preferredLocale: "en",
      allergies: { latex: "no", chlorhexidine: "no", lidocaine: "no", other: "" },
      gpPracticeId: millbrook,
      careTeamOrganisationIds: [org["Larch Ward"]],
    },
  });
  expect(res.status, await res.clone().text()).toBe(201);
  return ((await res.json()) as { patient: { id: string } }).patient.id;
}

const refer = (patientId: string, body: Record<string, unknown>, cookie = ward) =>
  call(postReferral, `/api/patients/${patientId}/referrals`, { cookie, params: { patientId }, body });

async function teamOf(patientId: string) {
  const rows = await db.select({ id: careTeam.organisationId, lead: careTeam.lead }).from(careTeam).where(eq(careTeam.patientId, patientId));
  return Object.fromEntries(rows.map((r) => [r.id, r.lead]));
}

describe("referral, accepted", () => {
  let patientId: string;
  let referralId: string;

  it("the directory lists wards and community teams, searchable, never GP practices", async () => {
    const all = await (await call(directory, "/api/teams", { cookie: ward })).json();
    const names = all.teams.map((t: { name: string }) => t.name);
    expect(names).toEqual(expect.arrayContaining(["Harbourside Community Nursing Team", "Larch Ward", "Rowan Ward"]));
    expect(names).not.toContain("Millbrook Surgery");
    const found = await (await call(directory, "/api/teams?q=harbour", { cookie: ward })).json();
    expect(found.teams.map((t: { name: string }) => t.name)).toEqual(["Harbourside Community Nursing Team"]);
  });

  it("a new patient's first team leads; the lead's numbers are the patient's", async () => {
    patientId = await registerOnWard();
    expect(await teamOf(patientId)).toEqual({ [org["Larch Ward"]]: true });
    const lead = await getLeadTeamContact({ patientId });
    expect(lead).toMatchObject({ name: "Larch Ward", phone: "01632 960 101" });
    // Larch Ward has no out-of-hours number of its own: the deployment's service (Settings) stands in.
    const [ooh] = await db.select().from(settings).where(eq(settings.key, "outOfHoursPhone"));
    expect(lead!.outOfHoursPhone).toBe(ooh.value);
    expect(lead!.outOfHoursIsService).toBe(true);
  });

  it("refuses a bad referral with every field's error and writes nothing", async () => {
    const before = await snapshot();
    const res = await refer(patientId, { toOrganisationId: "nope", handoverNote: "short", checklist: { ...checklist, suppliesDays: 0 } });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(Object.keys(error.fields)).toEqual(expect.arrayContaining(["toOrganisationId", "handoverNote", "referrerStays", "checklist.suppliesDays"]));
    expect(changedTables(before, await snapshot())).toEqual([]);
    // A GP practice is not a team to refer to; the team already on the care team neither.
    for (const to of [millbrook, org["Larch Ward"]]) {
      const r = await refer(patientId, { toOrganisationId: to, handoverNote: "Home tomorrow with a long-term catheter", referrerStays: false });
      expect(r.status).toBe(400);
    }
  });

  it("the ward nurse refers with the handover note and the checklist: audited, e-mailed to the community team", async () => {
    const res = await refer(patientId, { toOrganisationId: org["Harbourside Community Nursing Team"], handoverNote: "Home tomorrow with a long-term catheter; daughter helps.", referrerStays: false, checklist });
    expect(res.status, await res.clone().text()).toBe(201);
    referralId = (await res.json()).id;
    const [cl] = await db.select().from(dischargeChecklists).where(eq(dischargeChecklists.referralId, referralId));
    expect(cl).toMatchObject({ suppliesDays: 7, drainage: "valve", plannedTwocOn: "2027-01-14", portalActivationGiven: false });
    const [mail] = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, `referral:new:${referralId}`));
    expect(mail).toMatchObject({ kind: "referral-new", toAddress: "harbourside.team@eastmere.example", organisationId: org["Harbourside Community Nursing Team"] });
    const events = await db.select({ action: auditEvents.action }).from(auditEvents).where(eq(auditEvents.patientId, patientId));
    expect(events.map((e) => e.action)).toEqual(expect.arrayContaining(["referral.create", "discharge-checklist.record"]));
    // A second referral to the same team while one waits is refused.
    const again = await refer(patientId, { toOrganisationId: org["Harbourside Community Nursing Team"], handoverNote: "Sent twice by mistake here", referrerStays: true });
    expect(again.status).toBe(409);
  });

  it("the community team sees it as referred to them; the ward sees it waiting", async () => {
    const incoming = await listCaseloadReferrals({ organisationIds: [org["Harbourside Community Nursing Team"]], hours: 24 });
    expect(incoming.incoming.map((r) => r.id)).toContain(referralId);
    const outgoing = await listCaseloadReferrals({ organisationIds: [org["Larch Ward"]], hours: 24 });
    expect(outgoing.outgoing.map((r) => r.id)).toContain(referralId);
  });

  it("nobody but the receiving team answers: the referrer, another team, the patient, the admin", async () => {
    const before = await snapshot();
    for (const [cookie, status] of [[ward, 404], [rowanNurse, 404], [patientCookie, 403], [admin, 403], [undefined, 401]] as const) {
      const res = await call(accept, `/api/referrals/${referralId}/accept`, { cookie, params: { referralId } });
      expect(res.status).toBe(status);
    }
    expect(changedTables(before, await snapshot(), ["audit_events"])).toEqual([]);
  });

  it("the community nurse accepts: Harbourside joins and leads, Larch Ward leaves as the referrer chose", async () => {
    const res = await call(accept, `/api/referrals/${referralId}/accept`, { cookie: community, params: { referralId } });
    expect(res.status, await res.clone().text()).toBe(200);
    expect(await teamOf(patientId)).toEqual({ [org["Harbourside Community Nursing Team"]]: true });
    const lead = await getLeadTeamContact({ patientId });
    // Harbourside has its own out-of-hours number: that one, not the service's.
    expect(lead).toMatchObject({ name: "Harbourside Community Nursing Team", phone: "01632 960 210", outOfHoursPhone: "01632 960 299", outOfHoursIsService: false });
    expect((await getHelpContacts({ patientId })).team).toEqual([{ name: "Harbourside Community Nursing Team", phone: "01632 960 210", outOfHoursPhone: "01632 960 299" }]);
    const list = await (await call(listReferrals, `/api/patients/${patientId}/referrals`, { cookie: community, params: { patientId } })).json();
    expect(list.referrals[0]).toMatchObject({ status: "accepted", fromName: "Larch Ward", toName: "Harbourside Community Nursing Team" });
    const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, patientId), eq(auditEvents.action, "referral.accept")));
    expect(event.details).toMatchObject({ referralId, referrerLeft: true });
    // Answered once: a second answer is a conflict.
    expect((await call(decline, `/api/referrals/${referralId}/decline`, { cookie: community, params: { referralId }, body: { reason: "Changed our mind" } })).status).toBe(409);
    // The ward nurse left with her team: the record is no longer hers to see.
    expect((await call(listReferrals, `/api/patients/${patientId}/referrals`, { cookie: ward, params: { patientId } })).status).toBe(404);
  });

  it("the GP summary opens with the practice's action, names the nurse and the lead team, lists supplies to the TWOC; a reissue says what it replaces", async () => {
    await insertEpisode(patientId);
    const issue = async () => {
      const res = await call(postPassport, `/api/patients/${patientId}/passport`, { cookie: community, params: { patientId }, body: { reissue: true } });
      expect(res.status, await res.clone().text()).toBe(201);
    };
    await issue();
    const summaries = async () =>
      db.select().from(outboundMessages).where(and(eq(outboundMessages.patientId, patientId), eq(outboundMessages.kind, "gp-summary"))).orderBy(outboundMessages.createdAt);
    const [first] = await summaries();
    // The first thing said is what the practice needs to do: here, prescribe only until the trial.
    const text = first.text.slice(first.text.indexOf("For the practice"));
    expect(first.text.indexOf("For the practice")).toBeLessThan(first.text.indexOf("Patient"));
    // The demo deployment writes dates for region GB (Settings).
    expect(text).toContain("Awaiting trial without catheter on Thursday, 14 January 2027");
    expect(first.text).toContain("Responsible nurse");
    expect(first.text).toContain("Grace Mensah");
    expect(first.text).toContain("Harbourside Community Nursing Team, 01632 960 210 (out of hours 01632 960 299)");
    expect(first.text).toMatch(/Supplies for \d+ days/);
    expect(first.text).toContain("Not taught: washing around the catheter");
    expect(first.text).toContain("Portal activation code not given");
    expect(first.attachments[0].filename).toMatch(/-no1\.pdf$/);
    await issue();
    const [, second] = await summaries();
    expect(second.text).toContain("This is summary no. 2 for this patient. It replaces the one of");
    expect(second.attachments[0].filename).toMatch(/-no2\.pdf$/);
    expect(second.idempotencyKey).not.toBe(first.idempotencyKey);
  });
});

describe("referral, declined", () => {
  it("the reason goes back to the referrer (caseload and e-mail); the ward keeps the patient", async () => {
    const patientId = await registerOnWard();
    const res = await refer(patientId, { toOrganisationId: org["Harbourside Community Nursing Team"], handoverNote: "Home on Friday; lives alone.", referrerStays: false });
    const referralId = (await res.json()).id;
    const empty = await call(decline, `/api/referrals/${referralId}/decline`, { cookie: community, params: { referralId }, body: { reason: " " } });
    expect(empty.status).toBe(400);
    const r = await call(decline, `/api/referrals/${referralId}/decline`, { cookie: community, params: { referralId }, body: { reason: "Outside our area: refer to the Westside team" } });
    expect(r.status, await r.clone().text()).toBe(200);
    expect(await teamOf(patientId)).toEqual({ [org["Larch Ward"]]: true });
    const { outgoing } = await listCaseloadReferrals({ organisationIds: [org["Larch Ward"]], hours: 24 });
    expect(outgoing.find((x) => x.id === referralId)).toMatchObject({ status: "declined", declineReason: "Outside our area: refer to the Westside team" });
    const [mail] = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, `referral:declined:${referralId}`));
    expect(mail.toAddress).toBe("larch.ward@eastmere.example");
    expect(mail.text).toContain("Outside our area");
  });
});

describe("referral, unanswered", () => {
  it("after the reminder time it is sent again through the outbox, once per period, and audited", async () => {
    const patientId = await registerOnWard();
    const res = await refer(patientId, { toOrganisationId: org["Harbourside Community Nursing Team"], handoverNote: "Home today; nobody at home until 6 pm.", referrerStays: true });
    const referralId = (await res.json()).id;
    // Not yet due: nothing sent, nothing flagged.
    expect((await sendReferralReminders()).sent).toBe(0);
    const flag = async () => (await listCaseloadReferrals({ organisationIds: [org["Larch Ward"]], hours: 24 })).outgoing.find((r) => r.id === referralId)?.overdue;
    expect(await flag()).toBe(false);
    // Sent 25 hours ago: flagged on the ward's caseload.
    await db.update(referrals).set({ createdAt: new Date(Date.now() - 25 * 3_600_000) }).where(eq(referrals.id, referralId));
    expect(await flag()).toBe(true);
    await db.update(referrals).set({ createdAt: new Date() }).where(eq(referrals.id, referralId));
    // 25 hours later (default reminder time 24 h).
    const later = new Date(Date.now() + 25 * 3_600_000);
    const first = await sendReferralReminders({ now: later });
    expect(first.sent).toBeGreaterThanOrEqual(1);
    const again = await sendReferralReminders({ now: later });
    expect(again.sent).toBe(0);
    const [mail] = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, `referral:reminder:${referralId}:1`));
    expect(mail).toMatchObject({ kind: "referral-reminder", toAddress: "harbourside.team@eastmere.example" });
    const [row] = await db.select().from(referrals).where(eq(referrals.id, referralId));
    expect(row.reminders).toBe(1);
    const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, patientId), eq(auditEvents.action, "referral.remind")));
    expect(event).toBeTruthy();
    // The admin's setting shortens it: 1 hour.
    await db.insert(settings).values({ key: "referralReminderHours", value: 1 }).onConflictDoUpdate({ target: settings.key, set: { value: 1 } });
    const second = await sendReferralReminders({ now: new Date(later.getTime() + 2 * 3_600_000) });
    expect(second.sent).toBeGreaterThanOrEqual(1);
    await db.delete(settings).where(eq(settings.key, "referralReminderHours"));
    // The referrer withdraws it: no more reminders.
    const w = await call(withdraw, `/api/patients/${patientId}/referrals/${referralId}/withdraw`, { cookie: ward, params: { patientId, referralId } });
    expect(w.status).toBe(200);
    expect((await sendReferralReminders({ now: new Date(Date.now() + 100 * 3_600_000) })).sent).toBe(0);
  });
});

describe("the admin's settings for transfers", () => {
  it("keeps the out-of-hours service number and the reminder hours; refuses bad values and non-admins", async () => {
    const patch = (cookie: string, body: unknown) => call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie, body });
    const bad = await patch(admin, { outOfHoursPhone: "call us", referralReminderHours: 0 });
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(["outOfHoursPhone", "referralReminderHours"]);
    expect((await patch(ward, { referralReminderHours: 12 })).status).toBe(403);
    const ok = await patch(admin, { outOfHoursPhone: "01632 960 998", referralReminderHours: 12 });
    expect(ok.status, await ok.clone().text()).toBe(200);
    const patientId = await registerOnWard();
    // Larch Ward has no out-of-hours number of its own: the new service number stands in.
    expect((await getLeadTeamContact({ patientId }))!.outOfHoursPhone).toBe("01632 960 998");
    // Cleared, no team number and no service: none is shown rather than one made up.
    expect((await patch(admin, { outOfHoursPhone: null, referralReminderHours: null })).status).toBe(200);
    expect(await getLeadTeamContact({ patientId })).toMatchObject({ outOfHoursPhone: null, outOfHoursIsService: false });
    await patch(admin, { outOfHoursPhone: "01632 960 999" });
  });
});

describe("the care team afterwards", () => {
  it("adds a team, changes the lead, and a team leaves only while another remains; each audited with its reason", async () => {
    const patientId = await registerOnWard();
    const base = `/api/patients/${patientId}/care-team`;
    // Alone on the care team, the ward cannot leave.
    const alone = await call(leaveCareTeam, `${base}/${org["Larch Ward"]}`, { method: "DELETE", cookie: ward, params: { patientId, organisationId: org["Larch Ward"] }, body: { reason: "Patient went home" } });
    expect(alone.status).toBe(409);
    const add = await call(postCareTeam, base, { cookie: ward, params: { patientId }, body: { organisationId: org["Harbourside Community Nursing Team"], reason: "Shared care after discharge" } });
    expect(add.status, await add.clone().text()).toBe(201);
    const lead = await call(patchCareTeam, base, { method: "PATCH", cookie: community, params: { patientId }, body: { leadOrganisationId: org["Harbourside Community Nursing Team"], reason: "Community team now leads" } });
    expect(lead.status).toBe(200);
    expect((await getLeadTeamContact({ patientId }))!.name).toBe("Harbourside Community Nursing Team");
    // Only one's own team: the community nurse cannot take the ward off.
    const notOwn = await call(leaveCareTeam, `${base}/${org["Larch Ward"]}`, { method: "DELETE", cookie: community, params: { patientId, organisationId: org["Larch Ward"] }, body: { reason: "Tidying up" } });
    expect(notOwn.status).toBe(403);
    const left = await call(leaveCareTeam, `${base}/${org["Larch Ward"]}`, { method: "DELETE", cookie: ward, params: { patientId, organisationId: org["Larch Ward"] }, body: { reason: "Patient went home" } });
    expect(left.status, await left.clone().text()).toBe(200);
    expect(await teamOf(patientId)).toEqual({ [org["Harbourside Community Nursing Team"]]: true });
    const events = await db.select({ action: auditEvents.action, reason: auditEvents.reason }).from(auditEvents).where(eq(auditEvents.patientId, patientId));
    expect(events).toEqual(
      expect.arrayContaining([
        { action: "care-team.add", reason: "Shared care after discharge" },
        { action: "care-team.lead", reason: "Community team now leads" },
        { action: "care-team.leave", reason: "Patient went home" },
      ]),
    );
  });

  it("visit access is not the care team: no referral, no change of team, no checklist, no passport reissue", async () => {
    const arthur = (await db.select({ id: careTeam.patientId }).from(careTeam).where(eq(careTeam.organisationId, org["Harbourside Community Nursing Team"])))[0].id;
    const end = await grantVisitAccess({ patientId: arthur, userId: await userIdByEmail("ward.nurse@eastmere.example") });
    try {
      const before = await snapshot();
      const params = { patientId: arthur };
      const results = [
        await refer(arthur, { toOrganisationId: org["Rowan Ward"], handoverNote: "Visiting nurse tries to refer", referrerStays: true }),
        await call(postCareTeam, `/api/patients/${arthur}/care-team`, { cookie: ward, params, body: { organisationId: org["Larch Ward"], reason: "Visiting nurse adds own ward" } }),
        await call(patchCareTeam, `/api/patients/${arthur}/care-team`, { method: "PATCH", cookie: ward, params, body: { leadOrganisationId: org["Harbourside Community Nursing Team"], reason: "Visiting" } }),
        await call(postChecklist, `/api/patients/${arthur}/discharge-checklist`, { cookie: ward, params, body: checklist }),
        await call(postPassport, `/api/patients/${arthur}/passport`, { cookie: ward, params, body: { reissue: true } }),
      ];
      expect(results.map((r) => r.status)).toEqual([403, 403, 403, 403, 403]);
      expect(changedTables(before, await snapshot(), ["audit_events"])).toEqual([]);
    } finally {
      await end();
    }
  });

  it("the discharge checklist on its own: items not done are kept as not done", async () => {
    const patientId = await registerOnWard();
    const res = await call(postChecklist, `/api/patients/${patientId}/discharge-checklist`, {
      cookie: ward,
      params: { patientId },
      body: { taught: [], suppliesGiven: false, portalActivationGiven: false },
    });
    expect(res.status, await res.clone().text()).toBe(201);
    const [row] = await db.select().from(dischargeChecklists).where(eq(dischargeChecklists.patientId, patientId));
    expect(row).toMatchObject({ taught: [], suppliesGiven: false, suppliesDays: null, drainage: null, plannedTwocOn: null });
    const missing = await call(postChecklist, `/api/patients/${patientId}/discharge-checklist`, { cookie: ward, params: { patientId }, body: { taught: ["juggling"], suppliesGiven: true } });
    expect(missing.status).toBe(400);
    expect(Object.keys((await missing.json()).error.fields)).toEqual(expect.arrayContaining(["taught.0", "portalActivationGiven"]));
    // Supplies handed over: for how many days must be said.
    const days = await call(postChecklist, `/api/patients/${patientId}/discharge-checklist`, { cookie: ward, params: { patientId }, body: { taught: [], suppliesGiven: true, portalActivationGiven: true } });
    expect((await days.json()).error.fields).toHaveProperty("suppliesDays");
  });
});
