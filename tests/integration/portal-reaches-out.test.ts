// Issue 17: the patient sees who looked at their record (the access-log route, the data download in
// words) and the check-in history with who answered and whether the care team saw it. Carers are
// refused the log (ASVS 8.2.1; the matrix row is in security/access-matrix.ts).
import { randomUUID } from "node:crypto";
import { and, eq, like } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as checkInsPost } from "@/app/api/check-ins/route";
import { GET as diaryGet, POST as diaryPost } from "@/app/api/diary/route";
import { PUT as carerAlerts } from "@/app/api/portal/carer-alerts/route";
import { DELETE as removeCarer } from "@/app/api/patients/[patientId]/carers/[linkId]/route";
import { GET as accessLog } from "@/app/api/patients/[patientId]/access-log/route";
import { GET as exportData } from "@/app/api/patients/[patientId]/export/route";
import { db } from "@/db";
import { auditEvents, carerLinks, checkIns, outboundMessages, user } from "@/db/schema";
import { listCheckInsWithAcknowledgement } from "@/db/queries/caseload-items";
import { patientIdByHrn, userIdByEmail } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";

let arthur: string;
let priya: string;
let joan: string;
const REASON = "Night visit: catheter not draining (issue 17 test)";

beforeAll(async () => {
  arthur = await patientIdByHrn("EM-100-001");
  priya = await userIdByEmail(demo.rowanNurse.email);
  joan = await userIdByEmail(demo.carer.email);
  const longAgo = new Date(Date.UTC(2026, 0, 14, 10, 0));
  await db.insert(auditEvents).values([
    // A visiting clinician: the grant with the reason, then the card by QR; one view long ago.
    { action: "visit-access.grant", actorUserId: priya, actorRole: "clinician", patientId: arthur, via: "visit_access" as const, reason: REASON, at: new Date(Date.now() - 60_000) },
    { action: "passport.card.view", actorUserId: priya, actorRole: "clinician", patientId: arthur, via: "qr" as const, at: new Date(Date.now() - 120_000) },
    { action: "patient.view.details", actorUserId: priya, actorRole: "clinician", patientId: arthur, via: "visit_access" as const, at: longAgo },
  ]);
});

describe("who looked at my record", () => {
  it("the patient reads their own log: the visiting clinician by name, how (QR, visit access) and the reason", async () => {
    const res = await call(accessLog, `/api/patients/${arthur}/access-log?who=outside&pageSize=100`, { cookie: await sessionFor("patient"), params: { patientId: arthur } });
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.entries).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ action: "visit-access.grant", actorName: "Priya Sandhu", via: "visit_access", reason: REASON }),
        expect.objectContaining({ action: "passport.card.view", actorName: "Priya Sandhu", via: "qr" }),
      ]),
    );
    expect(body.entries.every((e: { via: string | null }) => e.via !== "care_team")).toBe(true);
  });

  it("filters by calendar month; a malformed month is 400", async () => {
    const cookie = await sessionFor("patient");
    const jan = await (await call(accessLog, `/api/patients/${arthur}/access-log?month=2026-01`, { cookie, params: { patientId: arthur } })).json();
    expect(jan.month).toBe("2026-01");
    expect(jan.entries.some((e: { action: string }) => e.action === "patient.view.details")).toBe(true);
    expect(jan.entries.every((e: { at: string }) => e.at.startsWith("2026-01"))).toBe(true);
    const bad = await call(accessLog, `/api/patients/${arthur}/access-log?month=2026-13`, { cookie, params: { patientId: arthur } });
    expect(bad.status).toBe(400);
  });

  it("the patient reading their own log adds nothing to it", async () => {
    const cookie = await sessionFor("patient");
    const before = (await (await call(accessLog, `/api/patients/${arthur}/access-log`, { cookie, params: { patientId: arthur } })).json()).total;
    const after = (await (await call(accessLog, `/api/patients/${arthur}/access-log`, { cookie, params: { patientId: arthur } })).json()).total;
    expect(after).toBe(before);
  });

  it("a carer is refused (403); the data download says the same in words, with names and no ids", async () => {
    expect((await call(accessLog, `/api/patients/${arthur}/access-log`, { cookie: await sessionFor("carer"), params: { patientId: arthur } })).status).toBe(403);
    const res = await call(exportData, `/api/patients/${arthur}/export`, { cookie: await sessionFor("patient"), params: { patientId: arthur } });
    expect(res.status).toBe(200);
    const data = await res.json();
    const grant = data.accessLog.find((l: { reason: string | null }) => l.reason === REASON);
    expect(grant).toMatchObject({ who: "Priya Sandhu", role: "Clinician", organisation: "Rowan Ward", how: "With visit access (not your usual care team)", what: "Was given visit access" });
    const qr = data.accessLog.find((l: { how: string; who: string }) => l.who === "Priya Sandhu" && l.how.includes("QR"));
    expect(qr).toBeDefined();
    expect(JSON.stringify(data.accessLog)).not.toContain(priya);
  });
});

describe("who made each entry", () => {
  it("the patient's diary names the carer who added a drink; her own entries need no name", async () => {
    const clientKey = randomUUID();
    const added = await call(diaryPost, "/api/diary", { cookie: await sessionFor("carer"), body: { patientId: arthur, kind: "in", volumeMl: 150, clientKey } });
    expect(added.status).toBe(201);
    expect((await added.json()).entry).toMatchObject({ byYou: true, byName: null });
    const range = `from=${encodeURIComponent(new Date(Date.now() - 3_600_000).toISOString())}&to=${encodeURIComponent(new Date(Date.now() + 60_000).toISOString())}`;
    const res = await call(diaryGet, `/api/diary?patientId=${arthur}&${range}`, { cookie: await sessionFor("patient") });
    const entry = (await res.json()).entries.find((e: { clientKey: string }) => e.clientKey === clientKey);
    expect(entry).toMatchObject({ byYou: false, byName: "Joan Pell" });
  });
});

describe("check-in history", () => {
  it("says who answered each check-in", async () => {
    await db.insert(checkIns).values({ patientId: arthur, reportedByUserId: joan, answers: { draining: "yes", pain: "none" }, level: "self-care", ruleIds: [], idempotencyKey: `i17-history-${Date.now()}` });
    const rows = await listCheckInsWithAcknowledgement({ patientId: arthur, limit: 200 });
    expect(rows.find((r) => r.reportedByUserId === joan)).toMatchObject({ reporterName: "Joan Pell", alerted: false });
  });
});

const fine = { newConfusion: false, breathless: false, feelsVeryUnwell: false, shivering: false, catheterOut: false, draining: "yes", pain: "none", blood: "none" };

describe("carers told in time", () => {
  it("a carer turns alerts on; the patient's urgent check-in e-mails her through the outbox, once; the patient may not set it (403)", async () => {
    const carer = await sessionFor("carer");
    expect((await call(carerAlerts, "/api/portal/carer-alerts", { method: "PUT", cookie: await sessionFor("patient"), body: { patientId: arthur, on: true } })).status).toBe(403);
    expect((await call(carerAlerts, "/api/portal/carer-alerts", { method: "PUT", cookie: carer, body: { patientId: arthur, on: "yes" } })).status).toBe(400);
    const on = await call(carerAlerts, "/api/portal/carer-alerts", { method: "PUT", cookie: carer, body: { patientId: arthur, on: true } });
    expect(on.status).toBe(200);
    const key = randomUUID();
    const patient = await sessionFor("patient");
    const first = await call(checkInsPost, "/api/check-ins", { cookie: patient, body: { patientId: arthur, answers: { ...fine, draining: "none" }, idempotencyKey: key } });
    const { checkIn } = await first.json();
    expect(checkIn.level).toBe("urgent");
    // The same check-in sent again (an offline phone) sends nothing more.
    await call(checkInsPost, "/api/check-ins", { cookie: patient, body: { patientId: arthur, answers: { ...fine, draining: "none" }, idempotencyKey: key } });
    const mails = await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `carer-alert:${checkIn.id}:%`));
    expect(mails).toHaveLength(1);
    expect(mails[0]).toMatchObject({ toAddress: demo.carer.email, kind: "carer-alert" });
    expect(mails[0].subject).toBe("Arthur reported an urgent problem");
    expect(mails[0].text).toContain("The care team has been told");
  });

  it("with alerts off she is not e-mailed; a check-in she answered herself does not e-mail her", async () => {
    const carer = await sessionFor("carer");
    const own = await call(checkInsPost, "/api/check-ins", { cookie: carer, body: { patientId: arthur, answers: { ...fine, draining: "none" }, idempotencyKey: randomUUID() } });
    const ownId = (await own.json()).checkIn.id;
    expect(await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `carer-alert:${ownId}:%`))).toHaveLength(0);
    await call(carerAlerts, "/api/portal/carer-alerts", { method: "PUT", cookie: carer, body: { patientId: arthur, on: false } });
    const res = await call(checkInsPost, "/api/check-ins", { cookie: await sessionFor("patient"), body: { patientId: arthur, answers: { ...fine, draining: "none" }, idempotencyKey: randomUUID() } });
    const id = (await res.json()).checkIn.id;
    expect(await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `carer-alert:${id}:%`))).toHaveLength(0);
  });

  it("a removed carer is told by e-mail and the patient gets a confirmation; her portal has no patient any more", async () => {
    const email = `carer.removed.${randomUUID().slice(0, 8)}@testwick.example`;
    const [u] = await db.insert(user).values({ id: randomUUID(), name: "Rhoda Leaver", email, role: "carer" }).returning({ id: user.id });
    const [link] = await db.insert(carerLinks).values({ patientId: arthur, carerUserId: u.id, invitedEmail: email, status: "active", acceptedAt: new Date() }).returning({ id: carerLinks.id });
    const res = await call(removeCarer, `/api/patients/${arthur}/carers/${link.id}`, { method: "DELETE", cookie: await sessionFor("patient"), params: { patientId: arthur, linkId: link.id } });
    expect(res.status).toBe(204);
    const [told] = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, `carer-removed:${link.id}`));
    expect(told).toMatchObject({ toAddress: email, subject: "You no longer help Arthur on Caddis" });
    const [confirm] = await db.select().from(outboundMessages).where(and(eq(outboundMessages.idempotencyKey, `carer-removed-confirm:${link.id}`), eq(outboundMessages.toAddress, demo.patient.email)));
    expect(confirm.text).toContain("Rhoda Leaver can no longer see your record");
  });
});
