// Closing the loop (issue 16): an urgent or emergency check-in and an alerting NEWS2 leave an
// item to acknowledge on the alert team's caseload, with an alert e-mail of least identity (health
// record number and a link, no name or date of birth) that says who reported and their notes. A
// nurse of the team acknowledges it with what was done; the patient's Today reads when. An item
// nobody acknowledged in time is sent again once, through the outbox.
import { randomUUID } from "node:crypto";
import { and, eq, like } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as acknowledgePost } from "@/app/api/patients/[patientId]/caseload-items/[itemId]/route";
import { POST as checkInsPost } from "@/app/api/check-ins/route";
import { POST as visitsPost } from "@/app/api/patients/[patientId]/visits/route";
import { PATCH as settingsPatch } from "@/app/api/admin/settings/route";
import { getAcknowledgePlan } from "@/lib/config/settings";
import { db } from "@/db";
import { listCheckInsWithAcknowledgement } from "@/db/queries/caseload-items";
import { auditEvents, caseloadItems, outboundMessages, patients } from "@/db/schema";
import { getViewerFromHeaders } from "@/lib/auth/session";
import { openItemsFor, sendAcknowledgeReminders } from "@/lib/records/caseload-items";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";
import { clinicianInNewTeam, grantVisitAccess, patientIdByHrn, userIdByEmail } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";

let arthur: string;
let ip = 0;
const fine = { newConfusion: false, breathless: false, feelsVeryUnwell: false, shivering: false, catheterOut: false, draining: "yes", pain: "none", blood: "none" };
const checkIn = (cookie: string, answers: Record<string, unknown>) =>
  call(checkInsPost, "/api/check-ins", { cookie, body: { patientId: arthur, answers, idempotencyKey: randomUUID() }, headers: { [CLIENT_ADDRESS_HEADER]: `10.77.0.${++ip}` } });
const acknowledge = (cookie: string, itemId: string, body: unknown, patientId = arthur) =>
  call(acknowledgePost, `/api/patients/${patientId}/caseload-items/${itemId}`, { cookie, body, params: { patientId, itemId } });
const itemOf = async (where: { checkInId?: string; observationId?: string }) =>
  (await db.select().from(caseloadItems).where(where.checkInId ? eq(caseloadItems.checkInId, where.checkInId) : eq(caseloadItems.observationId, where.observationId!)))[0];
const mailsFor = (sourceId: string) => db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `care-team-alert:%:${sourceId}:%`));

async function getSessionViewerForTest(cookie: string) {
  const viewer = await getViewerFromHeaders(new Headers({ cookie }));
  if (!viewer) throw new Error("no session");
  return viewer;
}

beforeAll(async () => {
  arthur = await patientIdByHrn("EM-100-001");
});

describe("alerts become items to acknowledge, with least-identity e-mails", () => {
  it("an urgent check-in from the patient: item due within the working time, e-mail with the record number, no name or birth date", async () => {
    const before = Date.now();
    const res = await checkIn(await sessionFor("patient"), { ...fine, draining: "none" });
    const { checkIn: c } = await res.json();
    expect(c.level).toBe("urgent");
    const item = await itemOf({ checkInId: c.id });
    expect(item).toMatchObject({ kind: "check-in", level: "urgent", closedAt: null, reporter: { kind: "patient" } });
    // Two working hours (default): never sooner than two hours away.
    expect(item!.dueAt!.getTime()).toBeGreaterThanOrEqual(before + 2 * 3_600_000 - 1000);
    const [p] = await db.select().from(patients).where(eq(patients.id, arthur));
    const mails = await mailsFor(c.id);
    expect(mails.length).toBeGreaterThan(0);
    for (const m of mails) {
      expect(m.text).toContain(p!.healthRecordNumber);
      expect(m.text).toContain("Reported by");
      expect(m.text).toContain("The patient");
      expect(m.text).toMatch(/\/patients\/[0-9a-f-]{36}/);
      for (const identity of [p!.givenName, p!.familyName, p!.dateOfBirth, "1941", "Pell"]) expect(`${m.subject} ${m.text} ${m.html}`).not.toContain(identity);
    }
  });

  it("a carer's emergency check-in names the carer", async () => {
    const res = await checkIn(await sessionFor("carer"), { ...fine, catheterOut: true, feelsVeryUnwell: true });
    const { checkIn: c } = await res.json();
    expect(c.level).toBe("emergency");
    expect(await itemOf({ checkInId: c.id })).toMatchObject({ kind: "check-in", level: "emergency", reporter: { kind: "carer", name: "Joan Pell" } });
    const [m] = await mailsFor(c.id);
    expect(m!.text).toContain("Carer Joan Pell");
  });

  it("a NEWS2 of 5 (medium) from a visiting clinician: item, and the e-mail names them, their organisation and phone, with their notes", async () => {
    const rowan = await sessionFor("rowanNurse");
    const end = await grantVisitAccess({ patientId: arthur, userId: await userIdByEmail(demo.rowanNurse.email) });
    try {
      // Source: RCP NEWS2 (2017) chart 1: RR 21 → 2, SpO2 93 (scale 1) → 2, air → 0, SBP 120 → 0,
      // pulse 95 → 1, alert → 0, 37.5 °C → 0: total 5, medium.
      const res = await call(visitsPost, `/api/patients/${arthur}/visits`, {
        cookie: rowan,
        params: { patientId: arthur },
        body: {
          occurredAt: new Date(Date.now() - 60_000).toISOString(),
          notes: "Breathless on the stairs since yesterday.",
          observations: { respirationRate: 21, spo2: 93, spo2Scale: 1, onOxygen: false, systolicBp: 120, pulse: 95, consciousness: "A", temperatureC: 37.5 },
        },
      });
      expect(res.status).toBe(201);
      const body = await res.json();
      expect(body.observation.news2).toMatchObject({ total: 5, risk: "medium" });
      const item = await itemOf({ observationId: body.observation.id });
      expect(item).toMatchObject({ kind: "news2", level: "medium", eventId: body.eventId, reporter: { kind: "clinician", name: "Priya Sandhu", organisation: "Rowan Ward" } });
      const [m] = await mailsFor(body.observation.id);
      expect(m!.text).toContain("Visiting clinician: Priya Sandhu, Rowan Ward, ");
      expect(m!.text).toContain("Breathless on the stairs since yesterday.");
      expect(m!.text).not.toContain("Arthur");
    } finally {
      await end();
    }
  });
});

describe("POST /api/patients/[patientId]/caseload-items/[itemId]", () => {
  it("refuses a missing action, 'other' without a note, and outsiders; acknowledges once with what was done", async () => {
    const nurse = await sessionFor("communityNurse");
    const { checkIn: c } = await (await checkIn(await sessionFor("patient"), { ...fine, draining: "none" })).json();
    const item = (await itemOf({ checkInId: c.id }))!;

    const missing = await acknowledge(nurse, item.id, {});
    expect(missing.status).toBe(400);
    expect((await missing.json()).error.fields).toHaveProperty("action");
    const otherNoNote = await acknowledge(nurse, item.id, { action: "other" });
    expect(otherNoNote.status).toBe(400);
    expect((await otherNoNote.json()).error.fields).toHaveProperty("note");

    // Visit access is not the care team (403); another team does not see the record (404).
    const rowan = await sessionFor("rowanNurse");
    const end = await grantVisitAccess({ patientId: arthur, userId: await userIdByEmail(demo.rowanNurse.email) });
    try {
      expect((await acknowledge(rowan, item.id, { action: "phoned" })).status).toBe(403);
    } finally {
      await end();
    }
    const outsider = await clinicianInNewTeam("Outsider");
    try {
      expect((await acknowledge(outsider.cookie, item.id, { action: "phoned" })).status).toBe(404);
    } finally {
      await outsider.cleanup();
    }
    // An item of another patient is not found through this patient.
    const yusuf = await patientIdByHrn("EM-100-003");
    expect((await acknowledge(nurse, item.id, { action: "phoned" }, yusuf)).status).toBe(404);

    const ok = await acknowledge(nurse, item.id, { action: "phoned", note: "Spoke to Arthur; bag was kinked, draining again." });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toMatchObject({ id: item.id, closedByName: "Grace Mensah", action: "phoned" });
    const [row] = await db.select().from(caseloadItems).where(eq(caseloadItems.id, item.id));
    expect(row).toMatchObject({ action: "phoned", note: "Spoke to Arthur; bag was kinked, draining again." });
    expect((await acknowledge(nurse, item.id, { action: "visited" })).status).toBe(409);
    const audits = await db.select().from(auditEvents).where(and(eq(auditEvents.action, "caseload-item.acknowledge"), eq(auditEvents.patientId, arthur)));
    expect(audits.some((a) => (a.details as { itemId?: string }).itemId === item.id)).toBe(true);

    // The portal reads when the team saw it.
    const seen = (await listCheckInsWithAcknowledgement({ patientId: arthur, limit: 20 })).find((r) => r.id === c.id);
    expect(seen).toMatchObject({ level: "urgent", alerted: true });
    expect(seen!.seenAt).toBeInstanceOf(Date);
  });

  it("the caseload lists open items of the viewer's alert teams only", async () => {
    const { checkIn: c } = await (await checkIn(await sessionFor("patient"), { ...fine, draining: "none" })).json();
    const item = (await itemOf({ checkInId: c.id }))!;
    const grace = await getSessionViewerForTest(await sessionFor("communityNurse"));
    expect((await openItemsFor(grace)).map((i) => i.id)).toContain(item.id);
    const outsider = await clinicianInNewTeam("Outsider");
    try {
      expect((await openItemsFor(await getSessionViewerForTest(outsider.cookie))).map((i) => i.id)).not.toContain(item.id);
    } finally {
      await outsider.cleanup();
    }
  });
});

describe("sending again what nobody acknowledged", () => {
  it("sends an overdue item to the team once, marks it, and leaves acknowledged ones alone", async () => {
    const patient = await sessionFor("patient");
    const { checkIn: late } = await (await checkIn(patient, { ...fine, draining: "none" })).json();
    const { checkIn: done } = await (await checkIn(patient, { ...fine, draining: "none" })).json();
    const lateItem = (await itemOf({ checkInId: late.id }))!;
    const doneItem = (await itemOf({ checkInId: done.id }))!;
    const past = new Date(Date.now() - 60_000);
    await db.update(caseloadItems).set({ dueAt: past }).where(eq(caseloadItems.id, lateItem.id));
    await db.update(caseloadItems).set({ dueAt: past }).where(eq(caseloadItems.id, doneItem.id));
    expect((await acknowledge(await sessionFor("communityNurse"), doneItem.id, { action: "visited" })).status).toBe(200);

    const first = await sendAcknowledgeReminders();
    expect(first.sent).toBeGreaterThanOrEqual(1);
    const reminders = await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `care-team-alert:check-in:${late.id}:%:reminder`));
    expect(reminders.length).toBeGreaterThan(0);
    expect(reminders[0]!.subject).toMatch(/^Not yet acknowledged: /);
    expect((await db.select().from(caseloadItems).where(eq(caseloadItems.id, lateItem.id)))[0]!.resentAt).toBeInstanceOf(Date);
    expect(await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `care-team-alert:check-in:${done.id}:%:reminder`))).toHaveLength(0);

    await sendAcknowledgeReminders();
    const again = await db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `care-team-alert:check-in:${late.id}:%:reminder`));
    expect(again).toHaveLength(reminders.length);
    // Shown in red on the caseload.
    const grace = await getSessionViewerForTest(await sessionFor("communityNurse"));
    expect((await openItemsFor(grace)).find((i) => i.id === lateItem.id)).toMatchObject({ overdue: true });
  });
});

describe("the acknowledgement time in Settings", () => {
  it("an admin sets the minutes and the working day; a bad time is refused; new items are due by them", async () => {
    const admin = await sessionFor("admin");
    const patch = (body: unknown) => call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body });
    const bad = await patch({ acknowledgeWithinMinutes: 5, workingDayStart: "8am" });
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.fields).sort()).toEqual(["acknowledgeWithinMinutes", "workingDayStart"]);
    try {
      expect((await patch({ acknowledgeWithinMinutes: 30, workingDayStart: "00:00", workingDayEnd: "23:59" })).status).toBe(200);
      expect(await getAcknowledgePlan()).toMatchObject({ minutes: 30, hours: { start: 0, end: 23 * 60 + 59 } });
      const before = Date.now();
      const { checkIn: c } = await (await checkIn(await sessionFor("patient"), { ...fine, draining: "none" })).json();
      const item = (await itemOf({ checkInId: c.id }))!;
      const day = new Date(before).getUTCDay();
      // On a weekday (in London) the item is due 30 minutes on; at a weekend, on Monday.
      if (day >= 2 && day <= 5) expect(item.dueAt!.getTime() - before).toBeLessThan(32 * 60_000);
      expect(item.dueAt!.getTime() - before).toBeGreaterThanOrEqual(30 * 60_000 - 1000);
    } finally {
      await patch({ acknowledgeWithinMinutes: null, workingDayStart: null, workingDayEnd: null });
    }
    expect(await getAcknowledgePlan()).toMatchObject({ minutes: 120, hours: { start: 480, end: 1080 } });
  });
});
