// The portal's route handlers as a role matrix (ASVS 8.2.1, 8.2.2, 8.3.1; WSTG-ATHZ-04): a patient
// reaches only themselves, a carer only active links (removal bites at once), staff are refused
// portal writes, anonymous callers are asked to sign in, bad input writes nothing, and the same
// check-in key twice is one check-in.
import { randomUUID } from "node:crypto";
import { and, count, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as activate } from "@/app/api/activate/route";
import { POST as bagChangesPost } from "@/app/api/bag-changes/route";
import { POST as acceptCarer } from "@/app/api/carer-invites/accept/route";
import { POST as checkInsPost } from "@/app/api/check-ins/route";
import { DELETE as diaryDeleteRaw } from "@/app/api/diary/[id]/route";
import { GET as diaryGet, POST as diaryPost } from "@/app/api/diary/route";
import { GET as me } from "@/app/api/me/route";
import { DELETE as carerDeleteRaw } from "@/app/api/patients/[patientId]/carers/[linkId]/route";
import { POST as carersPostRaw } from "@/app/api/patients/[patientId]/carers/route";
import { POST as invitePostRaw } from "@/app/api/patients/[patientId]/invite/route";
import { db } from "@/db";
import { auditEvents, bagChanges, carerLinks, checkIns, diaryEntries, outboundMessages, patientInvites, patients, user } from "@/db/schema";
import { LIMITS } from "@/lib/http/rate-limit";
import { CODE_BITS } from "@/lib/auth/secret-codes";
import { call, sessionFor } from "../support/http";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

// Handlers with typed params, called through the untyped test helper.
const carersPost = carersPostRaw as unknown as Parameters<typeof call>[0];
const carerDelete = carerDeleteRaw as unknown as Parameters<typeof call>[0];
const invitePost = invitePostRaw as unknown as Parameters<typeof call>[0];
const diaryDelete = diaryDeleteRaw as unknown as Parameters<typeof call>[0];

type Staff = "communityNurse" | "rowanNurse" | "admin" | "wardNurse";
const ids: Record<string, string> = {};
let ipN = 1;
const freshIp = () => `10.61.${Math.floor(ipN / 250)}.${ipN++ % 250}`;

async function patientId(hrn: string) {
  const [p] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, hrn));
  return p.id;
}

beforeAll(async () => {
  ids.arthur = await patientId("EM-100-001");
  ids.halina = await patientId("EM-100-002");
  ids.yusuf = await patientId("EM-100-003");
  ids.maria = await patientId("EM-100-004");
});

const fine = { newConfusion: false, breathless: false, feelsVeryUnwell: false, shivering: false, catheterOut: false, draining: "yes", pain: "none", blood: "none" };
const checkIn = (patient: string, answers: Record<string, unknown> = fine, key = randomUUID()) => ({ patientId: patient, answers, idempotencyKey: key });
const rows = async (key: string) => (await db.select({ n: count() }).from(checkIns).where(eq(checkIns.idempotencyKey, key)))[0].n;

async function post(handler: typeof checkInsPost, path: string, body: unknown, cookie?: string) {
  return call(handler, path, { body, cookie, headers: { [CLIENT_ADDRESS_HEADER]: freshIp() } });
}

/** The invitation token, read from the queued e-mail (it is never returned to the inviter). */
async function carerInviteToken(linkId: string) {
  const [mail] = await db.select({ text: outboundMessages.text }).from(outboundMessages).where(eq(outboundMessages.sourceId, linkId));
  const token = /\/carer-invite\/([A-Za-z0-9_-]{43})/.exec(mail?.text ?? "")?.[1];
  if (!token) throw new Error(`no queued carer invitation for link ${linkId}`);
  return token;
}

/** A new carer for Arthur through the real invitation flow; returns their cookie and link id. */
async function newCarerForArthur() {
  const email = `carer.${randomUUID().slice(0, 8)}@eastmere.example`;
  const inv = await call(carersPost, `/api/patients/${ids.arthur}/carers`, {
    body: { email },
    cookie: await sessionFor("patient"),
    params: { patientId: ids.arthur },
  });
  expect(inv.status).toBe(201);
  const { linkId } = await inv.json();
  const token = await carerInviteToken(linkId);
  const acc = await call(acceptCarer, "/api/carer-invites/accept", {
    body: { token, name: "Sam Carer", password: "a-long-carer-password" },
    headers: { [CLIENT_ADDRESS_HEADER]: freshIp() },
  });
  expect(acc.status).toBe(200);
  const cookie = acc.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  expect(cookie).toMatch(/session_token/);
  return { cookie, linkId: linkId as string, email };
}

describe("POST /api/check-ins", () => {
  it("anonymous → 401, nothing written", async () => {
    const body = checkIn(ids.arthur);
    const res = await post(checkInsPost, "/api/check-ins", body);
    expect(res.status).toBe(401);
    expect(await rows(body.idempotencyKey)).toBe(0);
  });

  it.each(["communityNurse", "admin"] as Staff[])("%s (staff) → 403 on a portal write", async (who) => {
    const body = checkIn(ids.arthur);
    const res = await post(checkInsPost, "/api/check-ins", body, await sessionFor(who));
    expect(res.status).toBe(403);
    expect(await rows(body.idempotencyKey)).toBe(0);
  });

  it("patient: own → 201 with the server's level; another patient → 404", async () => {
    const cookie = await sessionFor("patient");
    const own = checkIn(ids.arthur, { ...fine, cloudyOrSmelly: true });
    const res = await post(checkInsPost, "/api/check-ins", own, cookie);
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.checkIn.level).toBe("self-care");
    expect(body.checkIn.ruleIds).toEqual(["TRIAGE-CLOUDY-OR-SMELLY"]);
    const other = checkIn(ids.yusuf);
    expect((await post(checkInsPost, "/api/check-ins", other, cookie)).status).toBe(404);
    expect(await rows(other.idempotencyKey)).toBe(0);
  });

  it("carer: linked → 201 (audited via carer); unlinked → 404", async () => {
    const cookie = await sessionFor("carer");
    const linked = checkIn(ids.arthur);
    const res = await post(checkInsPost, "/api/check-ins", linked, cookie);
    expect(res.status).toBe(201);
    const { checkIn: saved } = await res.json();
    const [event] = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "check-in.submit"), sql`${auditEvents.details}->>'checkInId' = ${saved.id}`));
    expect(event.via).toBe("carer");
    const other = checkIn(ids.yusuf);
    expect((await post(checkInsPost, "/api/check-ins", other, cookie)).status).toBe(404);
  });

  it("the same idempotency key twice → the first result, 200, one row", async () => {
    const cookie = await sessionFor("patient");
    const key = randomUUID();
    const first = await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, { ...fine, pain: "mild" }, key), cookie);
    expect(first.status).toBe(201);
    // A resend with other answers still gets the first result.
    const again = await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, { ...fine, pain: "severe" }, key), cookie);
    expect(again.status).toBe(200);
    const a = await first.json();
    const b = await again.json();
    expect(b.checkIn.id).toBe(a.checkIn.id);
    expect(b.checkIn.level).toBe("soon");
    expect(await rows(key)).toBe(1);
  });

  it("two sends of one key at the same moment make one row", async () => {
    const cookie = await sessionFor("patient");
    const body = checkIn(ids.arthur, fine);
    const results = await Promise.all([1, 2, 3].map(() => post(checkInsPost, "/api/check-ins", body, cookie)));
    expect(results.map((r) => r.status).sort()).toEqual([200, 200, 201]);
    expect(await rows(body.idempotencyKey)).toBe(1);
  });

  it("a key used for another patient is refused (409), not returned", async () => {
    const key = randomUUID();
    expect((await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, fine, key), await sessionFor("patient"))).status).toBe(201);
    const res = await post(checkInsPost, "/api/check-ins", checkIn(ids.yusuf, fine, key), await sessionFor("patientAr"));
    expect(res.status).toBe(409);
  });

  it.each([
    ["a level sent by the phone", { ...checkIn(randomUUID()), level: "self-care" }],
    ["an unknown answer", checkIn("", { ...fine, feelsFine: true })],
    ["a wrong answer value", checkIn("", { ...fine, draining: "lots" })],
    ["a temperature in °F", checkIn("", { ...fine, temperatureC: 101 })],
    ["no idempotency key", { patientId: "", answers: fine }],
    ["an unfinished check-in that is not an emergency", checkIn("", { newConfusion: false, breathless: false })],
  ])("bad input (%s) → 400 and nothing written", async (_, raw) => {
    const body = { ...(raw as Record<string, unknown>), patientId: ids.arthur };
    const before = (await db.select({ n: count() }).from(checkIns))[0].n;
    const res = await post(checkInsPost, "/api/check-ins", body, await sessionFor("patient"));
    expect(res.status).toBe(400);
    expect((await res.json()).error.code).toBe("validation_failed");
    expect((await db.select({ n: count() }).from(checkIns))[0].n).toBe(before);
  });

  it("an emergency answer alone is a result: stored as emergency, flags the caseload, records the alert", async () => {
    const res = await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, { newConfusion: true }), await sessionFor("patient"));
    expect(res.status).toBe(201);
    const { checkIn: saved } = await res.json();
    expect(saved.level).toBe("emergency");
    expect(saved.answers).toEqual({ newConfusion: true });
    const [p] = await db.select().from(patients).where(eq(patients.id, ids.arthur));
    expect(p.latestCheckInLevel).toBe("emergency");
    const alerts = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "check-in.alert"), sql`${auditEvents.details}->>'sourceId' = ${saved.id}`));
    expect(alerts).toHaveLength(1);
  });

  it("urgent alerts the care team; self-care does not", async () => {
    const cookie = await sessionFor("patient");
    const urgent = await (await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, { ...fine, draining: "none" }), cookie)).json();
    const calm = await (await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, fine), cookie)).json();
    expect(urgent.checkIn.level).toBe("urgent");
    expect(calm.checkIn.level).toBe("self-care");
    const alertFor = async (id: string) =>
      (await db.select().from(auditEvents).where(and(eq(auditEvents.action, "check-in.alert"), sql`${auditEvents.details}->>'sourceId' = ${id}`))).length;
    expect(await alertFor(urgent.checkIn.id)).toBe(1);
    expect(await alertFor(calm.checkIn.id)).toBe(0);
    // The e-mail to each care-team inbox is queued with the check-in (Arthur: Harbourside team).
    const mailFor = async (id: string) => db.select().from(outboundMessages).where(eq(outboundMessages.sourceId, id));
    const queued = await mailFor(urgent.checkIn.id);
    expect(queued.length).toBeGreaterThanOrEqual(1);
    expect(queued.every((m) => m.kind === "care-team-alert")).toBe(true);
    expect(await mailFor(calm.checkIn.id)).toHaveLength(0);
  });

  it("takes the catheter route from the record, not the phone (suprapubic catheter out)", async () => {
    const res = await post(checkInsPost, "/api/check-ins", checkIn(ids.yusuf, { ...fine, catheterOut: true, draining: "none" }), await sessionFor("patientAr"));
    const body = await res.json();
    expect(body.checkIn.ruleIds).toContain("TRIAGE-CATHETER-OUT-SUPRAPUBIC");
    const sent = await post(checkInsPost, "/api/check-ins", checkIn(ids.yusuf, { ...fine, route: "urethral" }), await sessionFor("patientAr"));
    expect(sent.status).toBe(400);
  });

  it("an offline check-in answered earlier keeps its time and does not replace a newer latest level", async () => {
    const cookie = await sessionFor("patient");
    await post(checkInsPost, "/api/check-ins", checkIn(ids.arthur, fine), cookie);
    const answeredAt = new Date(Date.now() - 3 * 3_600_000).toISOString();
    const res = await post(checkInsPost, "/api/check-ins", { ...checkIn(ids.arthur, { ...fine, pain: "mild" }), answeredAt }, cookie);
    const body = await res.json();
    expect(body.checkIn.answeredAt).toBe(answeredAt);
    const [p] = await db.select().from(patients).where(eq(patients.id, ids.arthur));
    expect(p.latestCheckInLevel).toBe("self-care");
  });

  it("refuses an answer time in the future or older than 7 days with a field error, and writes nothing", async () => {
    const cookie = await sessionFor("patient");
    const before = (await db.select({ n: count() }).from(checkIns))[0].n;
    for (const [answeredAt, code] of [
      [new Date(Date.now() + 60 * 60_000).toISOString(), "in_future"],
      [new Date(Date.now() - 8 * 86_400_000).toISOString(), "too_old"],
    ] as const) {
      const res = await post(checkInsPost, "/api/check-ins", { ...checkIn(ids.arthur, fine), answeredAt }, cookie);
      expect(res.status).toBe(400);
      expect((await res.json()).error.fields.answeredAt).toEqual([code]);
    }
    expect((await db.select({ n: count() }).from(checkIns))[0].n).toBe(before);
  });
});

describe("diary", () => {
  const entry = (patient: string, volumeMl = 250, kind = "in") => ({ patientId: patient, kind, volumeMl });

  it("role matrix for POST /api/diary", async () => {
    const before = (await db.select({ n: count() }).from(diaryEntries))[0].n;
    expect((await post(diaryPost, "/api/diary", entry(ids.arthur))).status).toBe(401);
    expect((await post(diaryPost, "/api/diary", entry(ids.arthur), await sessionFor("communityNurse"))).status).toBe(403);
    expect((await post(diaryPost, "/api/diary", entry(ids.yusuf), await sessionFor("patient"))).status).toBe(404);
    expect((await post(diaryPost, "/api/diary", entry(ids.yusuf), await sessionFor("carer"))).status).toBe(404);
    expect((await post(diaryPost, "/api/diary", entry(ids.arthur, 0))).status).toBe(401);
    for (const bad of [entry(ids.arthur, 0), entry(ids.arthur, 5001), entry(ids.arthur, 12.5), entry(ids.arthur, 200, "both"), { ...entry(ids.arthur), at: "2001-01-01T00:00:00Z" }]) {
      const res = await post(diaryPost, "/api/diary", bad, await sessionFor("patient"));
      expect(res.status, JSON.stringify(bad)).toBe(400);
    }
    expect((await db.select({ n: count() }).from(diaryEntries))[0].n).toBe(before);
    expect((await post(diaryPost, "/api/diary", entry(ids.arthur), await sessionFor("patient"))).status).toBe(201);
    expect((await post(diaryPost, "/api/diary", entry(ids.arthur, 400, "out"), await sessionFor("carer"))).status).toBe(201);
  });

  it("an entry made offline keeps its own time, and sent twice with its key is one entry", async () => {
    const cookie = await sessionFor("patient");
    const clientKey = randomUUID();
    const at = new Date(Date.now() - 6 * 3_600_000).toISOString();
    const first = await post(diaryPost, "/api/diary", { ...entry(ids.arthur, 330), at, clientKey }, cookie);
    expect(first.status).toBe(201);
    const again = await post(diaryPost, "/api/diary", { ...entry(ids.arthur, 330), at, clientKey }, cookie);
    expect(again.status).toBe(200);
    const [a, b] = [(await first.json()).entry, (await again.json()).entry];
    expect(b.id).toBe(a.id);
    expect(a.at).toBe(at);
    expect(await db.select().from(diaryEntries).where(eq(diaryEntries.clientKey, clientKey))).toHaveLength(1);
    // The key is the patient's own: the carer of another patient cannot reuse it for them.
    const other = await post(diaryPost, "/api/diary", { ...entry(ids.yusuf, 330), at, clientKey }, await sessionFor("patientAr"));
    expect(other.status).toBe(409);
    for (const [when, code] of [
      [new Date(Date.now() + 60 * 60_000).toISOString(), "in_future"],
      [new Date(Date.now() - 8 * 86_400_000).toISOString(), "too_old"],
    ] as const) {
      const res = await post(diaryPost, "/api/diary", { ...entry(ids.arthur), at: when, clientKey: randomUUID() }, cookie);
      expect((await res.json()).error.fields.at).toEqual([code]);
    }
  });

  it("GET /api/diary returns own entries in range; others 404; staff 403", async () => {
    const from = new Date(Date.now() - 86_400_000).toISOString();
    const to = new Date(Date.now() + 60_000).toISOString();
    const q = (p: string) => `/api/diary?patientId=${p}&from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`;
    const res = await call(diaryGet, q(ids.arthur), { cookie: await sessionFor("patient") });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.entries.length).toBeGreaterThanOrEqual(2);
    expect(Object.keys(body.entries[0]).sort()).toEqual(["at", "byName", "byYou", "clientKey", "id", "kind", "removable", "volumeMl"]);
    expect((await call(diaryGet, q(ids.yusuf), { cookie: await sessionFor("patient") })).status).toBe(404);
    expect((await call(diaryGet, q(ids.arthur), { cookie: await sessionFor("communityNurse") })).status).toBe(403);
    expect((await call(diaryGet, q(ids.arthur))).status).toBe(401);
    expect((await call(diaryGet, `/api/diary?patientId=${ids.arthur}&from=x&to=y`, { cookie: await sessionFor("patient") })).status).toBe(400);
  });

  it("DELETE: own entry within 24 h → 204; someone else's → 403; older → 403; another patient's → 404", async () => {
    const mine = await (await post(diaryPost, "/api/diary", entry(ids.arthur, 150), await sessionFor("patient"))).json();
    const carers = await (await post(diaryPost, "/api/diary", entry(ids.arthur, 200), await sessionFor("carer"))).json();
    const del = (id: string, cookie?: string) => call(diaryDelete, `/api/diary/${id}`, { method: "DELETE", cookie, params: { id } });
    expect((await del(carers.entry.id, await sessionFor("patient"))).status).toBe(403);
    expect((await del(mine.entry.id, await sessionFor("communityNurse"))).status).toBe(403);
    expect((await del(mine.entry.id)).status).toBe(401);
    expect((await del(mine.entry.id, await sessionFor("patientAr"))).status).toBe(404);
    expect((await del(mine.entry.id, await sessionFor("patient"))).status).toBe(204);
    expect(await db.select().from(diaryEntries).where(eq(diaryEntries.id, mine.entry.id))).toHaveLength(0);
    await db.update(diaryEntries).set({ createdAt: new Date(Date.now() - 25 * 3_600_000) }).where(eq(diaryEntries.id, carers.entry.id));
    expect((await del(carers.entry.id, await sessionFor("carer"))).status).toBe(403);
    expect((await del("not-a-uuid", await sessionFor("patient"))).status).toBe(404);
  });
});

describe("bag changes", () => {
  it("patient and linked carer log a change; next is 7 days on; others refused", async () => {
    const body = { patientId: ids.arthur, kind: "leg-bag" };
    const res = await post(bagChangesPost, "/api/bag-changes", body, await sessionFor("patient"));
    expect(res.status).toBe(201);
    const out = await res.json();
    // Source: NHS patient pages, leg bags changed every 7 days (BAG_INTERVALS in lib/clinical).
    expect(out.next.daysUntil).toBe(7);
    expect((await post(bagChangesPost, "/api/bag-changes", { ...body, kind: "valve" }, await sessionFor("carer"))).status).toBe(201);
    expect((await post(bagChangesPost, "/api/bag-changes", { patientId: ids.yusuf, kind: "valve" }, await sessionFor("carer"))).status).toBe(404);
    expect((await post(bagChangesPost, "/api/bag-changes", body, await sessionFor("communityNurse"))).status).toBe(403);
    expect((await post(bagChangesPost, "/api/bag-changes", body)).status).toBe(401);
    const before = (await db.select({ n: count() }).from(bagChanges))[0].n;
    expect((await post(bagChangesPost, "/api/bag-changes", { ...body, kind: "night-bag" }, await sessionFor("patient"))).status).toBe(400);
    expect((await db.select({ n: count() }).from(bagChanges))[0].n).toBe(before);
  });
});

describe("patient activation", () => {
  const invite = (patient: string, cookie: string | undefined, body: unknown = {}) =>
    call(invitePost, `/api/patients/${patient}/invite`, { body, cookie, params: { patientId: patient } });

  it("only the care team's clinicians invite; a patient with an account cannot be invited again", async () => {
    expect((await invite(ids.halina, undefined)).status).toBe(401);
    expect((await invite(ids.halina, await sessionFor("patient"))).status).toBe(403);
    expect((await invite(ids.halina, await sessionFor("carer"))).status).toBe(403);
    expect((await invite(ids.halina, await sessionFor("admin"))).status).toBe(403);
    // Rowan Ward is not in Halina's care team.
    expect((await invite(ids.halina, await sessionFor("rowanNurse"))).status).toBe(404);
    expect((await invite(ids.arthur, await sessionFor("communityNurse"))).status).toBe(409);
    expect((await invite(ids.halina, await sessionFor("communityNurse"), { email: "not an address" })).status).toBe(400);
  });

  it("makes a ≥ 50-bit code from an unambiguous alphabet, stored only as a hash, for 14 days", async () => {
    expect(CODE_BITS).toBeGreaterThanOrEqual(50);
    const res = await invite(ids.maria, await sessionFor("wardNurse"));
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.code).toMatch(/^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/);
    expect(body.code).not.toMatch(/[01ILOU]/);
    const days = (Date.parse(body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(13.9);
    expect(days).toBeLessThanOrEqual(14);
    const stored = await db.select().from(patientInvites).where(eq(patientInvites.patientId, ids.maria));
    expect(JSON.stringify(stored)).not.toContain(body.code.replace(/-/g, ""));
    // A second code replaces the first.
    const second = await (await invite(ids.maria, await sessionFor("wardNurse"))).json();
    const act = await call(activate, "/api/activate", {
      body: { code: body.code, email: "maria.popescu@eastmere.example", password: "a-long-new-password" },
      headers: { [CLIENT_ADDRESS_HEADER]: freshIp() },
    });
    expect(act.status).toBe(400);
    expect(second.code).not.toBe(body.code);
  });

  it("the patient activates with the code, e-mail and a good password, is signed in, and the code is spent", async () => {
    const email = "halina.nowak@eastmere.example";
    const sent = await (await invite(ids.halina, await sessionFor("communityNurse"), { email })).json();
    const { code } = sent;
    // With an address the code also goes by e-mail, in Halina's language (Polish), via the outbox.
    expect(sent.emailed).toBe(true);
    const [mail] = await db.select().from(outboundMessages).where(and(eq(outboundMessages.kind, "portal-invite"), eq(outboundMessages.toAddress, email)));
    expect(mail).toMatchObject({ locale: "pl", redactAfterSend: true });
    expect(mail.text).toContain(code);
    const act = (body: unknown) => call(activate, "/api/activate", { body, headers: { [CLIENT_ADDRESS_HEADER]: freshIp() } });
    const before = (await db.select({ n: count() }).from(user))[0].n;
    const weak = await act({ code, email, password: "short" });
    expect(weak.status).toBe(400);
    const common = await act({ code, email, password: "passwordpassword" });
    expect((await common.json()).error.fields.password).toEqual(["password_too_common"]);
    const otherEmail = await act({ code, email: "someone.else@eastmere.example", password: "a-long-new-password" });
    expect((await otherEmail.json()).error.fields.code).toEqual(["invalid"]);
    expect((await db.select({ n: count() }).from(user))[0].n).toBe(before);

    const ok = await act({ code: code.toLowerCase().replace(/-/g, " "), email, password: "a-long-new-password" });
    expect(ok.status).toBe(201);
    expect((await ok.json()).next).toBe("/pl/today");
    const cookie = ok.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const who = await (await call(me, "/api/me", { cookie })).json();
    expect(who.role).toBe("patient");
    const [p] = await db.select().from(patients).where(eq(patients.id, ids.halina));
    expect(p.userId).not.toBeNull();
    expect((await act({ code, email, password: "a-long-new-password" })).status).toBe(400);
    // Now a patient: their own check-in works.
    expect((await post(checkInsPost, "/api/check-ins", checkIn(ids.halina), cookie)).status).toBe(201);
  });

  it("limits code guesses per address (PostgreSQL counter), not per account", async () => {
    const ip = freshIp();
    const statuses: number[] = [];
    for (let i = 0; i <= LIMITS.activate.max; i++) {
      const res = await call(activate, "/api/activate", {
        body: { code: `ZZZZ-ZZZZ-ZZ${String(i).padStart(2, "2")}`, email: "guess@eastmere.example", password: "a-long-new-password" },
        headers: { [CLIENT_ADDRESS_HEADER]: ip },
      });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, LIMITS.activate.max).every((s) => s === 400)).toBe(true);
    expect(statuses.at(-1)).toBe(429);
    const other = await call(activate, "/api/activate", {
      body: { code: "ZZZZ-ZZZZ-ZZZZ", email: "guess@eastmere.example", password: "a-long-new-password" },
      headers: { [CLIENT_ADDRESS_HEADER]: freshIp() },
    });
    expect(other.status).toBe(400);
  });
});

describe("carers", () => {
  it("a carer or admin cannot invite carers; a clinician of the care team can", async () => {
    const body = { email: "helper.one@eastmere.example" };
    const inv = async (cookie?: string) => call(carersPost, `/api/patients/${ids.arthur}/carers`, { body, cookie, params: { patientId: ids.arthur } });
    expect((await inv()).status).toBe(401);
    expect((await inv(await sessionFor("carer"))).status).toBe(403);
    expect((await inv(await sessionFor("admin"))).status).toBe(403);
    expect((await inv(await sessionFor("rowanNurse"))).status).toBe(404);
    expect((await call(carersPost, `/api/patients/${ids.yusuf}/carers`, { body, cookie: await sessionFor("patient"), params: { patientId: ids.yusuf } })).status).toBe(404);
    const res = await inv(await sessionFor("communityNurse"));
    expect(res.status).toBe(201);
    const out = await res.json();
    // The link goes only by e-mail (queued in the same transaction); only its hash is stored.
    expect(out.emailed).toBe(true);
    expect(out).not.toHaveProperty("inviteUrl");
    const token = await carerInviteToken(out.linkId);
    const [link] = await db.select().from(carerLinks).where(eq(carerLinks.id, out.linkId));
    expect(link.inviteTokenHash).not.toContain(token);
    const [mail] = await db.select().from(outboundMessages).where(eq(outboundMessages.sourceId, out.linkId));
    expect(mail).toMatchObject({ kind: "carer-invite", toAddress: body.email, redactAfterSend: true, status: "queued" });
  });

  it("a new carer accepts, sees only that patient, and loses access at once when removed", async () => {
    const { cookie, linkId } = await newCarerForArthur();
    expect((await post(diaryPost, "/api/diary", { patientId: ids.arthur, kind: "in", volumeMl: 200 }, cookie)).status).toBe(201);
    expect((await post(diaryPost, "/api/diary", { patientId: ids.yusuf, kind: "in", volumeMl: 200 }, cookie)).status).toBe(404);
    // Only the patient (or the care team) removes a carer; a carer cannot remove another.
    const del = (c: string) => call(carerDelete, `/api/patients/${ids.arthur}/carers/${linkId}`, { method: "DELETE", cookie: c, params: { patientId: ids.arthur, linkId } });
    expect((await del(await sessionFor("carer"))).status).toBe(403);
    expect((await del(await sessionFor("patientAr"))).status).toBe(404);
    expect((await del(await sessionFor("patient"))).status).toBe(204);
    const body = checkIn(ids.arthur);
    const after = await post(checkInsPost, "/api/check-ins", body, cookie);
    expect(after.status).toBe(404);
    expect(await rows(body.idempotencyKey)).toBe(0);
    expect((await del(await sessionFor("patient"))).status).toBe(404);
  });

  it("an existing carer account accepts with its password; a used or unknown token is refused", async () => {
    const email = "joan.pell@eastmere.example";
    // Joan already helps Arthur; Yusuf invites her too.
    const inv = await call(carersPost, `/api/patients/${ids.yusuf}/carers`, { body: { email }, cookie: await sessionFor("patientAr"), params: { patientId: ids.yusuf } });
    const token = await carerInviteToken((await inv.json()).linkId);
    const accept = (body: unknown) => call(acceptCarer, "/api/carer-invites/accept", { body, headers: { [CLIENT_ADDRESS_HEADER]: freshIp() } });
    const wrong = await accept({ token, password: "not-her-password" });
    expect(wrong.status).toBe(400);
    expect((await wrong.json()).error.fields.password).toEqual(["wrong"]);
    expect((await accept({ token, password: "Eastmere-carer-2026" })).status).toBe(200);
    expect((await accept({ token, password: "Eastmere-carer-2026" })).status).toBe(400);
    expect((await accept({ token: "x".repeat(43), password: "Eastmere-carer-2026" })).status).toBe(400);
    const links = await db.select().from(carerLinks).where(and(eq(carerLinks.patientId, ids.yusuf), eq(carerLinks.status, "active")));
    expect(links).toHaveLength(1);
    // Tidy: Yusuf removes her again so other tests see the seeded links only.
    await call(carerDelete, `/api/patients/${ids.yusuf}/carers/${links[0].id}`, { method: "DELETE", cookie: await sessionFor("patientAr"), params: { patientId: ids.yusuf, linkId: links[0].id } });
  });

  it("a patient cannot invite their own address; an address already linked is refused", async () => {
    const inv = (email: string) => call(carersPost, `/api/patients/${ids.arthur}/carers`, { body: { email }, cookie: acookie, params: { patientId: ids.arthur } });
    const acookie = await sessionFor("patient");
    expect((await (await inv("arthur.pell@eastmere.example")).json()).error.fields.email).toEqual(["own_address"]);
    expect((await (await inv("joan.pell@eastmere.example")).json()).error.fields.email).toEqual(["already_linked"]);
  });
});

describe("emergency number", () => {
  it("reads the emergency number from the settings and never guesses one", async () => {
    // Every place that shows it — portal pages (getHelpContacts), the offline page and the
    // passport booklet (getBookletRecord) — reads it through lib/config/settings with the one
    // validation the admin form uses: digits only, 2 to 6.
    const { getHelpContacts } = await import("@/db/queries/contacts");
    const { getBookletRecord } = await import("@/db/queries/passports");
    const { PATCH: settingsPatch } = await import("@/app/api/admin/settings/route");
    const { settings } = await import("@/db/schema");
    const shown = async () => {
      const help = (await getHelpContacts({ patientId: ids.arthur })).emergencyNumber;
      const booklet = (await getBookletRecord({ patientId: ids.arthur }))!.settings.emergencyNumber;
      expect(booklet, "the booklet and the portal agree").toBe(help);
      return help;
    };
    // Seeded demo deployment: 999 (db/seed.ts).
    expect(await shown()).toBe("999");
    try {
      // Values an admin could never save (edited by hand) are not shown anywhere.
      for (const bad of ["call someone", "+44 1632 960000", 999, "9"]) {
        await db.update(settings).set({ value: bad }).where(eq(settings.key, "emergencyNumber"));
        expect(await shown(), String(bad)).toBeNull();
      }
      await db.delete(settings).where(eq(settings.key, "emergencyNumber"));
      expect(await shown()).toBeNull();
      const res = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: await sessionFor("admin"), body: { emergencyNumber: "112" } });
      expect(res.status).toBe(200);
      expect(await shown()).toBe("112");
    } finally {
      // As the seed stores it (a JSON string; drizzle would read a saved copy back as a number).
      await db.insert(settings).values({ key: "emergencyNumber", value: "999" }).onConflictDoUpdate({ target: settings.key, set: { value: "999" } });
    }
    expect(await shown()).toBe("999");
  });
});

