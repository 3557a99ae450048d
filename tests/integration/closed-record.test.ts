// A closed record is read-only on every write route. The routes are found on disk (like the
// access matrix): each POST, PUT, PATCH and DELETE handler under app/api either has a request
// below that would change Arthur Pell's record — sent after an admin closed it, as a persona
// allowed to make it — or says why it is not a write to a patient's record. Each request must
// answer 409 `record_closed` and leave every table as it was.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as closeRecord } from "@/app/api/admin/patients/[patientId]/close/route";
import { db } from "@/db";
import { carerLinks, caseloadItems, diaryEntries, organisations, outboundMessages, patientInvites, patients, referrals, uploads, user } from "@/db/schema";
import { hashActivationCode, hashInviteToken, newActivationCode, newInviteToken } from "@/lib/auth/secret-codes";
import { changedTables, snapshot } from "../support/db-snapshot";
import { demoDevice } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";
import { fillPattern, listRouteFiles, type Method } from "../support/routes";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

type Who = keyof typeof demo | "anonymous";
const checklist = { taught: ["emptying-bag"], suppliesGiven: true, suppliesDays: 7, drainage: "bag", portalActivationGiven: false };
type Ids = {
  patientId: string;
  readyUploadId: string;
  pendingUploadId: string;
  diaryEntryId: string;
  carerLinkId: string;
  messageId: string;
  carerToken: string;
  activationCode: string;
  caseloadItemId: string;
  referralId: string;
  harbourside: string;
  rowan: string;
};
type Write = { who: Who; params?: (ids: Ids) => Record<string, string>; body?: (ids: Ids) => unknown; mayWrite?: string[] };
type Plan = Write | { notARecordWrite: string };

const hourAgo = () => new Date(Date.now() - 60 * 60_000).toISOString();
const patient = (ids: Ids) => ({ patientId: ids.patientId });
const device = {
  ...demoDevice,
  lot: "AB12",
  expiry: "2030-11-30",
  indication: "Chronic urinary retention",
  insertedAt: hourAgo(),
  gelKind: "plain",
  gelVolumeMl: 11,
  attempts: 1,
  overrides: [],
};
// Public routes count the attempt per address before anything else (lib/http/rate-limit.ts).
const counted = ["attempt_counters"];

const plans: Record<string, Plan> = {
  "POST /api/check-ins": { who: "patient", body: (i) => ({ patientId: i.patientId, idempotencyKey: randomUUID(), answers: { draining: "yes", pain: "none" } }) },
  "POST /api/diary": { who: "patient", body: (i) => ({ patientId: i.patientId, kind: "in", volumeMl: 200 }) },
  "DELETE /api/diary/[id]": { who: "patient", params: (i) => ({ id: i.diaryEntryId }) },
  "POST /api/bag-changes": { who: "carer", body: (i) => ({ patientId: i.patientId, kind: "leg-bag" }) },
  "PUT /api/portal/carer-alerts": { who: "carer", body: (i) => ({ patientId: i.patientId, on: true }) },
  "POST /api/patients/[patientId]/episodes": { who: "communityNurse", params: patient, body: () => device },
  "POST /api/patients/[patientId]/episodes/change": { who: "communityNurse", params: patient, body: () => ({ ...device, changeKind: "planned", needReviewed: true }) },
  "POST /api/patients/[patientId]/episodes/removal": { who: "communityNurse", params: patient, body: () => ({ removedAt: hourAgo(), reason: "no-longer-needed" }) },
  "POST /api/patients/[patientId]/episodes/twoc-plan": { who: "communityNurse", params: patient, body: () => ({ clear: true }) },
  "POST /api/patients/[patientId]/episodes/follow-up-review": { who: "communityNurse", params: patient, body: () => ({ reviewedAt: new Date().toISOString(), notes: "Passing urine well." }) },
  "POST /api/patients/[patientId]/episodes/twoc": { who: "communityNurse", params: patient, body: () => ({ occurredAt: hourAgo(), outcome: "passed", voids: [{ volumeMl: 250 }] }) },
  "POST /api/patients/[patientId]/episodes/check": { notARecordWrite: "a look-up: the findings for a draft, nothing stored but the audit event of the view" },
  "POST /api/patients/[patientId]/visits": { who: "communityNurse", params: patient, body: () => ({ occurredAt: hourAgo(), notes: "Visit after closing" }) },
  "POST /api/patients/[patientId]/caseload-items/[itemId]": {
    who: "communityNurse",
    params: (i) => ({ patientId: i.patientId, itemId: i.caseloadItemId }),
    body: () => ({ action: "phoned", note: "Called after closing" }),
  },
  "PATCH /api/patients/[patientId]": { who: "communityNurse", params: patient, body: () => ({ familyName: "Changed" }) },
  "POST /api/patients/[patientId]/passport": { who: "communityNurse", params: patient, body: () => ({ reissue: true }) },
  "POST /api/patients/[patientId]/uploads": {
    who: "patient",
    params: patient,
    body: () => ({ category: "site-photo", label: "Site today", contentType: "image/png", sizeBytes: 2048 }),
  },
  "POST /api/patients/[patientId]/uploads/[uploadId]/complete": { who: "communityNurse", params: (i) => ({ patientId: i.patientId, uploadId: i.pendingUploadId }) },
  "DELETE /api/patients/[patientId]/uploads/[uploadId]": { who: "communityNurse", params: (i) => ({ patientId: i.patientId, uploadId: i.readyUploadId }) },
  "POST /api/patients/[patientId]/supply-requests": {
    who: "communityNurse",
    params: patient,
    body: () => ({ periodDays: 28, include: { legBag: true, valve: false, nightBag: true, gel: false }, items: [{ item: "catheter", quantity: 2 }] }),
  },
  "POST /api/patients/[patientId]/messages/[messageId]/resend": { who: "communityNurse", params: (i) => ({ patientId: i.patientId, messageId: i.messageId }) },
  "POST /api/patients/[patientId]/invite": { who: "communityNurse", params: patient, body: () => ({}) },
  "POST /api/patients/[patientId]/referrals": {
    who: "communityNurse",
    params: patient,
    body: (i) => ({ toOrganisationId: i.rowan, handoverNote: "Going to the ward for a week", referrerStays: true, checklist }),
  },
  "POST /api/referrals/[referralId]/accept": { who: "wardNurse", params: (i) => ({ referralId: i.referralId }) },
  "POST /api/referrals/[referralId]/decline": { who: "wardNurse", params: (i) => ({ referralId: i.referralId }), body: () => ({ reason: "No beds this week" }) },
  "POST /api/patients/[patientId]/referrals/[referralId]/withdraw": { who: "communityNurse", params: (i) => ({ patientId: i.patientId, referralId: i.referralId }) },
  "POST /api/patients/[patientId]/care-team": { who: "communityNurse", params: patient, body: (i) => ({ organisationId: i.rowan, reason: "Shared care with the ward" }) },
  "PATCH /api/patients/[patientId]/care-team": { who: "communityNurse", params: patient, body: (i) => ({ leadOrganisationId: i.harbourside, reason: "Harbourside leads again" }) },
  "DELETE /api/patients/[patientId]/care-team/[organisationId]": {
    who: "communityNurse",
    params: (i) => ({ patientId: i.patientId, organisationId: i.harbourside }),
    body: () => ({ reason: "Care passed to another team" }),
  },
  "POST /api/patients/[patientId]/discharge-checklist": { who: "communityNurse", params: patient, body: () => checklist },
  "POST /api/patients/[patientId]/carers": { who: "patient", params: patient, body: () => ({ email: "new.carer@eastmere.example" }) },
  "DELETE /api/patients/[patientId]/carers/[linkId]": {
    notARecordWrite:
      "withdrawing a carer only narrows who can read the record and writes nothing into it; a patient whose record is closed can still take a carer's access away",
  },
  "POST /api/carer-invites/accept": { who: "anonymous", body: (i) => ({ token: i.carerToken, name: "Late Carer", password: "A-long-enough-password-2026" }), mayWrite: counted },
  "POST /api/activate": { who: "anonymous", body: (i) => ({ code: i.activationCode, email: "someone.new@eastmere.example", password: "A-long-enough-password-2026" }), mayWrite: counted },
  "POST /api/visit-access": {
    notARecordWrite: "a grant to read, reached only through a current passport, and closing revokes every passport of the record (the code then finds nothing: 404)",
  },
  "POST /api/admin/patients/[patientId]/close": { who: "admin", params: patient, body: () => ({ reason: "Closed a second time" }) },
  "POST /api/auth/[...all]": { notARecordWrite: "better-auth's sign-in and account endpoints" },
  "POST /api/patients": { notARecordWrite: "registers a new patient" },
  "POST /api/admin/organisations": { notARecordWrite: "organisations, not a patient" },
  "PATCH /api/admin/organisations/[organisationId]": { notARecordWrite: "organisations, not a patient" },
  "PATCH /api/admin/settings": { notARecordWrite: "deployment settings" },
  "POST /api/admin/staff/invitations": { notARecordWrite: "staff accounts" },
  "DELETE /api/admin/staff/invitations/[invitationId]": { notARecordWrite: "staff accounts" },
  "PATCH /api/admin/staff/[userId]": { notARecordWrite: "staff accounts" },
  "POST /api/admin/staff/[userId]/deactivate": { notARecordWrite: "staff accounts" },
  "POST /api/admin/staff/[userId]/reactivate": { notARecordWrite: "staff accounts" },
  "POST /api/staff-invitations/accept": { notARecordWrite: "staff accounts" },
  "POST /api/admin/staff/[userId]/sign-out": { notARecordWrite: "staff accounts: ends a member of staff's sessions" },
  "DELETE /api/account/sessions": { notARecordWrite: "the viewer's own sign-in sessions" },
  "PUT /api/account/reading": { notARecordWrite: "the viewer's own text size and contrast" },
  "POST /api/account/push": { notARecordWrite: "the viewer's own browser subscription for notifications" },
  "DELETE /api/account/push": { notARecordWrite: "the viewer's own browser subscription for notifications" },
  "PUT /api/account/reach": {
    notARecordWrite: "the viewer's own number, consent to texts, quiet hours and reminders; nothing in the record (a closed record's reminders stop in the scheduler)",
  },
  "DELETE /api/account/sessions/[sessionId]": { notARecordWrite: "the viewer's own sign-in sessions" },
};

type Handler = (req: Request, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;
const writeMethods = ["POST", "PUT", "PATCH", "DELETE"] as const satisfies readonly Method[];
const discovered: { key: string; pattern: string; method: Method; handler: Handler }[] = [];
for (const { pattern, file } of listRouteFiles()) {
  const mod = (await import(file)) as Record<string, unknown>;
  for (const m of writeMethods) {
    if (typeof mod[m] === "function") discovered.push({ key: `${m} ${pattern}`, pattern, method: m, handler: mod[m] as Handler });
  }
}

let ids: Ids;
const cookies: Partial<Record<Who, string>> = {};

beforeAll(async () => {
  const [arthur] = await db.select({ id: patients.id, userId: patients.userId }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  const [grace] = await db.select({ id: user.id }).from(user).where(eq(user.email, demo.communityNurse.email));
  const upload = (status: "pending" | "ready") =>
    db
      .insert(uploads)
      .values({ patientId: arthur.id, uploadedByUserId: grace.id, category: "other", objectKey: `patients/${arthur.id}/${randomUUID()}`, label: "Before closing", contentType: "image/png", sizeBytes: 70, status })
      .returning({ id: uploads.id });
  const [ready] = await upload("ready");
  const [pending] = await upload("pending");
  const [entry] = await db.insert(diaryEntries).values({ patientId: arthur.id, kind: "in", volumeMl: 250, at: new Date(), recordedByUserId: arthur.userId }).returning({ id: diaryEntries.id });
  const carerToken = newInviteToken();
  const [link] = await db
    .insert(carerLinks)
    .values({ patientId: arthur.id, invitedEmail: "late.carer@eastmere.example", inviteTokenHash: hashInviteToken(carerToken), inviteExpiresAt: new Date(Date.now() + 86_400_000) })
    .returning({ id: carerLinks.id });
  const activationCode = newActivationCode();
  await db.insert(patientInvites).values({ patientId: arthur.id, codeHash: hashActivationCode(activationCode), expiresAt: new Date(Date.now() + 86_400_000) });
  const [message] = await db
    .insert(outboundMessages)
    .values({ kind: "gp-summary", patientId: arthur.id, toAddress: "inbox@millbrook.example", subject: "Before closing", html: "<p>x</p>", text: "x", idempotencyKey: `closed-test:${randomUUID()}`, messageId: `<${randomUUID()}@caddis.test>`, status: "failed" })
    .returning({ id: outboundMessages.id });
  const [item] = await db
    .insert(caseloadItems)
    .values({ patientId: arthur.id, kind: "check-in", level: "urgent", summary: "Before closing", reporter: { kind: "patient" }, dueAt: new Date() })
    .returning({ id: caseloadItems.id });
  const orgId = async (name: string) => (await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, name)))[0].id;
  const [harbourside, larch, rowan] = [await orgId("Harbourside Community Nursing Team"), await orgId("Larch Ward"), await orgId("Rowan Ward")];
  const [referral] = await db
    .insert(referrals)
    .values({ patientId: arthur.id, fromOrganisationId: harbourside, toOrganisationId: larch, referredByUserId: grace.id, handoverNote: "Before closing", referrerStays: true })
    .returning({ id: referrals.id });
  ids = {
    patientId: arthur.id,
    readyUploadId: ready.id,
    pendingUploadId: pending.id,
    diaryEntryId: entry.id,
    carerLinkId: link.id,
    messageId: message.id,
    carerToken,
    activationCode,
    caseloadItemId: item.id,
    referralId: referral.id,
    harbourside,
    rowan,
  };
  for (const who of ["admin", "communityNurse", "wardNurse", "patient", "carer"] as const) cookies[who] = await sessionFor(who);
  const closed = await call(closeRecord, `/api/admin/patients/${arthur.id}/close`, {
    cookie: cookies.admin,
    params: { patientId: arthur.id },
    body: { reason: "Care ended: moved out of the area" },
  });
  expect(closed.status).toBe(200);
});

describe("a closed record is read-only on every write route", () => {
  it("has a plan for every write route on disk, and none for a route that does not exist", () => {
    const keys = discovered.map((d) => d.key);
    expect(keys.filter((k) => !plans[k]), "write routes with no plan here").toEqual([]);
    expect(Object.keys(plans).filter((k) => !keys.includes(k)), "plans for routes that do not exist").toEqual([]);
  });

  for (const [key, plan] of Object.entries(plans)) {
    if ("notARecordWrite" in plan) continue;
    it(`${key} → 409 record_closed, nothing written`, async () => {
      const route = discovered.find((d) => d.key === key);
      expect(route, `${key} exists`).toBeTruthy();
      const params = plan.params?.(ids) ?? {};
      const before = await snapshot();
      const res = await call(route!.handler, fillPattern(route!.pattern, params), {
        method: route!.method,
        cookie: plan.who === "anonymous" ? undefined : cookies[plan.who],
        params,
        body: plan.body?.(ids),
        headers: { [CLIENT_ADDRESS_HEADER]: `10.66.0.${Object.keys(plans).indexOf(key)}` },
      });
      const text = await res.text();
      expect(res.status, text.slice(0, 300)).toBe(409);
      expect(JSON.parse(text).error.code).toBe("record_closed");
      expect(changedTables(before, await snapshot(), plan.mayWrite), "nothing written").toEqual([]);
    });
  }

  it("the rows made before closing are still there, unchanged by the refusals", async () => {
    const [entry] = await db.select().from(diaryEntries).where(eq(diaryEntries.id, ids.diaryEntryId));
    expect(entry).toBeTruthy();
    const [link] = await db.select().from(carerLinks).where(and(eq(carerLinks.id, ids.carerLinkId), eq(carerLinks.status, "pending")));
    expect(link).toBeTruthy();
  });
});
