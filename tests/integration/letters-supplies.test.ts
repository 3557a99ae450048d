// The Letters tab's resend route (role matrix, new row per resend, audited) and supply requests
// (computed and adjusted quantities kept, e-mail to the GP, bad input writes nothing).
import { and, count, eq, isNull } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as resendRoute } from "@/app/api/patients/[patientId]/messages/[messageId]/resend/route";
import { GET as listMessagesRoute } from "@/app/api/patients/[patientId]/messages/route";
import { GET as listSuppliesRoute, POST as createSupplyRoute } from "@/app/api/patients/[patientId]/supply-requests/route";
import { db } from "@/db";
import { auditEvents, catheterEpisodes, organisations, outboundMessages, supplyRequests } from "@/db/schema";
import { suppliesFor } from "@/lib/clinical";
import { gpSummaryKey, queueGpSummary } from "@/lib/email/gp-summary";
import { queueMessage } from "@/lib/email/outbox";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { call, sessionFor } from "../support/http";
import { insertEpisode, mailPatient, waitForEmails, type MailFixture } from "../support/mail";

const quiet = () => {};
// The handlers type their params; the test helper takes any.
const h = (fn: unknown) => fn as Parameters<typeof call>[0];
const resend = h(resendRoute);
const listMessages = h(listMessagesRoute);
const listSupplies = h(listSuppliesRoute);
const createSupply = h(createSupplyRoute);
let fx: MailFixture;
let other: MailFixture;
let failedId: string;
let failedKey: string;

beforeAll(async () => {
  // No GP inbox at first: the summary is kept as failed, as it would be in real life.
  fx = await mailPatient({ gpInbox: false });
  other = await mailPatient();
  const { event } = await insertEpisode(fx.patientId, { plannedChangeOn: isoIn(84), reviewDueOn: isoIn(28) });
  const r = await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, eventId: event.id, cause: "insertion", actorName: "Grace Mensah" }));
  failedId = r.id;
  failedKey = gpSummaryKey({ cause: "insertion", eventId: event.id });
});
afterAll(async () => {
  await fx?.cleanup();
  await other?.cleanup();
});

function isoIn(days: number) {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

const resendPath = (patientId: string, messageId: string) => `/api/patients/${patientId}/messages/${messageId}/resend`;

describe("POST /api/patients/[patientId]/messages/[messageId]/resend", () => {
  const who = [
    ["anonymous", 401],
    ["admin", 403],
    ["patient", 403],
    ["carer", 403],
    ["rowanNurse", 404], // a clinician of another organisation
    ["wardNurse", 404],
  ] as const;
  for (const [persona, status] of who) {
    it(`as ${persona} → ${status}, and nothing is queued`, async () => {
      const cookie = persona === "anonymous" ? undefined : await sessionFor(persona);
      const before = await db.select({ n: count() }).from(outboundMessages).where(eq(outboundMessages.patientId, fx.patientId));
      const res = await call(resend, resendPath(fx.patientId, failedId), { method: "POST", cookie, params: { patientId: fx.patientId, messageId: failedId } });
      expect(res.status).toBe(status);
      const after = await db.select({ n: count() }).from(outboundMessages).where(eq(outboundMessages.patientId, fx.patientId));
      expect(after[0].n).toBe(before[0].n);
    });
  }

  it("as a care-team clinician: a failed summary is queued again as a new message to the practice's current inbox, and audited", async () => {
    const cookie = await sessionFor("communityNurse");
    // The practice's address is added after the summary failed.
    await db.update(organisations).set({ inboxEmail: fx.gpInbox }).where(eq(organisations.id, fx.gpId));
    const res = await call(resend, resendPath(fx.patientId, failedId), { method: "POST", cookie, params: { patientId: fx.patientId, messageId: failedId } });
    expect(res.status).toBe(201);
    const { message } = await res.json();
    expect(message).toMatchObject({ status: "queued", to: fx.gpInbox, resendOfId: failedId, kind: "gp-summary", attempts: 0 });
    expect(message).not.toHaveProperty("html");
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, message.id));
    expect(row.idempotencyKey).toBe(`${failedKey}:resend:1`);
    expect(row.attachments).toHaveLength(1);
    const [original] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, failedId));
    expect(original.status).toBe("failed"); // the record of what happened is kept
    const audits = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.patientId, fx.patientId), eq(auditEvents.action, "message.resend")));
    expect(audits.map((a) => a.details)).toContainEqual(expect.objectContaining({ messageId: failedId, resendId: message.id }));

    // Delivered with its PDF.
    await drainOutbox({ keyPrefix: row.idempotencyKey, log: quiet });
    const [mail] = await waitForEmails(fx.gpInbox, 1);
    expect(mail.attachments?.[0].contentType).toBe("application/pdf");

    // A message still on its way cannot be resent; a sent one can, as resend 2 of the original.
    const again = await call(resend, resendPath(fx.patientId, message.id), { method: "POST", cookie, params: { patientId: fx.patientId, messageId: message.id } });
    expect(again.status).toBe(201);
    const second = (await again.json()).message;
    const [row2] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, second.id));
    expect(row2.idempotencyKey).toBe(`${failedKey}:resend:2`);
    expect(row2.resendOfId).toBe(failedId);
    const busy = await call(resend, resendPath(fx.patientId, second.id), { method: "POST", cookie, params: { patientId: fx.patientId, messageId: second.id } });
    expect(busy.status).toBe(409);
  });

  it("a message of another patient, or an id that is not one, is not found", async () => {
    const cookie = await sessionFor("communityNurse");
    const theirs = await db.transaction((tx) =>
      queueMessage(tx, { idempotencyKey: `test:${other.tag}:theirs`, kind: "test", to: null, subject: "x", html: "", text: "", patientId: other.patientId }),
    );
    const res = await call(resend, resendPath(fx.patientId, theirs.id), { method: "POST", cookie, params: { patientId: fx.patientId, messageId: theirs.id } });
    expect(res.status).toBe(404);
    const bad = await call(resend, resendPath(fx.patientId, "not-a-uuid"), { method: "POST", cookie, params: { patientId: fx.patientId, messageId: "not-a-uuid" } });
    expect(bad.status).toBe(404);
  });

  it("GET …/messages lists the patient's messages with their state, without the HTML", async () => {
    const res = await call(listMessages, `/api/patients/${fx.patientId}/messages`, { cookie: await sessionFor("communityNurse"), params: { patientId: fx.patientId } });
    expect(res.status).toBe(200);
    const { messages } = await res.json();
    expect(messages.length).toBeGreaterThanOrEqual(3);
    expect(messages.map((m: { status: string }) => m.status)).toContain("failed");
    expect(messages[0]).not.toHaveProperty("html");
    expect(messages.find((m: { id: string }) => m.id === failedId).lastError).toBe("no_recipient");
  });
});

describe("supply requests", () => {
  const path = (id: string) => `/api/patients/${id}/supply-requests`;
  const body = (overrides: Record<string, unknown> = {}) => {
    // Source: lib/clinical suppliesFor, 84-day planned change, 28 days, leg and night bags, gel.
    const lines = suppliesFor({ changeIntervalDays: 84, legBag: true, valve: false, nightBag: true, gel: true }, 28).lines;
    return {
      periodDays: 28,
      include: { legBag: true, valve: false, nightBag: true, gel: true },
      items: lines.map((l) => ({ item: l.item, quantity: l.item === "leg-bag" ? l.quantity + 1 : l.quantity })),
      note: "Prefers <b>Northfen</b> leg bags",
      ...overrides,
    };
  };

  it("the nurse's adjusted request is kept beside the computed one and e-mailed to the GP practice", async () => {
    const cookie = await sessionFor("communityNurse");
    const res = await call(createSupply, path(fx.patientId), { cookie, body: body(), params: { patientId: fx.patientId } });
    expect(res.status).toBe(201);
    const { supplyRequest } = await res.json();
    const [row] = await db.select().from(supplyRequests).where(eq(supplyRequests.id, supplyRequest.id));
    expect(row.periodDays).toBe(28);
    expect(row.requestedByName).toBe("Grace Mensah");
    // 28 days with the next change in 84 days (common practice, no source): no change falls in
    // the period, so the spare catheter and its gel only (the nurse asked 2 of each); 4 leg bags
    // (nurse asked 5), 28 night bags.
    expect(row.items).toEqual([
      { item: "catheter", computed: 1, quantity: 2, intervalDays: 84 },
      { item: "leg-bag", computed: 4, quantity: 5, intervalDays: 7 },
      { item: "night-bag", computed: 28, quantity: 28, intervalDays: 1 },
      { item: "gel", computed: 1, quantity: 2, intervalDays: 84 },
    ]);
    const [msg] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, row.messageId!));
    expect(msg).toMatchObject({ kind: "supply-request", toAddress: fx.gpInbox, status: "queued", idempotencyKey: `supply-request:${row.id}` });
    await drainOutbox({ keyPrefix: msg.idempotencyKey, log: quiet });
    const mails = await waitForEmails(fx.gpInbox, 2);
    const mail = mails.find((m) => m.subject.includes("supply request"))!;
    expect(mail.text).toContain("Leg bags | 5 |");
    expect(mail.text).toContain("Night bags | 28 |");
    expect(mail.text).toContain("All silicone");
    expect(mail.text).toContain("14 Ch, 10 ml balloon");
    expect(mail.html).toContain("Prefers &lt;b&gt;Northfen&lt;/b&gt; leg bags");

    const list = await call(listSupplies, path(fx.patientId), { cookie, params: { patientId: fx.patientId } });
    expect((await list.json()).supplyRequests[0]).toMatchObject({ id: row.id, message: { status: "sent" } });
  });

  it("bad input → 400 with every field error, and nothing written", async () => {
    const cookie = await sessionFor("communityNurse");
    const before = await db.select({ n: count() }).from(supplyRequests).where(eq(supplyRequests.patientId, fx.patientId));
    const res = await call(createSupply, path(fx.patientId), {
      cookie,
      body: { periodDays: 0, include: { legBag: true, valve: false, nightBag: true, gel: true }, items: [{ item: "catheter", quantity: -1 }, { item: "gel", quantity: 1.5 }] },
      params: { patientId: fx.patientId },
    });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.code).toBe("validation_failed");
    expect(Object.keys(error.fields).sort()).toEqual(["items.0.quantity", "items.1.quantity", "periodDays"]);
    const wrongItems = await call(createSupply, path(fx.patientId), { cookie, body: body({ include: { legBag: true, valve: true, nightBag: true, gel: true } }), params: { patientId: fx.patientId } });
    expect(wrongItems.status).toBe(400);
    expect((await wrongItems.json()).error.fields).toEqual({ items: ["itemsChanged"] });
    const nothing = await call(createSupply, path(fx.patientId), {
      cookie,
      body: body({ items: body().items.map((i) => ({ ...i, quantity: 0 })) }),
      params: { patientId: fx.patientId },
    });
    expect(nothing.status).toBe(400);
    const after = await db.select({ n: count() }).from(supplyRequests).where(eq(supplyRequests.patientId, fx.patientId));
    expect(after[0].n).toBe(before[0].n);
  });

  it("with no catheter in place → 409 and nothing written", async () => {
    await db.update(catheterEpisodes).set({ removedAt: new Date() }).where(eq(catheterEpisodes.patientId, other.patientId));
    const res = await call(createSupply, path(other.patientId), { cookie: await sessionFor("communityNurse"), body: body(), params: { patientId: other.patientId } });
    expect(res.status).toBe(409);
    expect(await db.select().from(supplyRequests).where(eq(supplyRequests.patientId, other.patientId))).toHaveLength(0);
  });

  for (const [persona, status] of [["anonymous", 401], ["patient", 403], ["admin", 403], ["rowanNurse", 404]] as const) {
    it(`POST as ${persona} → ${status}`, async () => {
      const cookie = persona === "anonymous" ? undefined : await sessionFor(persona);
      const res = await call(createSupply, path(fx.patientId), { cookie, body: body(), params: { patientId: fx.patientId } });
      expect(res.status).toBe(status);
    });
  }
});

describe("supplies follow the real change day and the blockage history", () => {
  it("Halina (demo), whose catheters blocked after 21 days four times, is planned on the blockage interval, not 84 days", async () => {
    const { getSupplyContext } = await import("@/db/queries/supply-requests");
    const { patientIdByHrn } = await import("../support/fixtures");
    const ctx = (await getSupplyContext({ patientId: await patientIdByHrn("EM-100-002") }))!;
    // common practice, no source: blockagePattern's typical dwell 21 days less a 3-day margin = 18.
    expect(ctx.plannedIntervalDays).toBe(84);
    expect(ctx.changeIntervalDays).toBe(18);
    // Inserted 36 days ago: 18 days from insertion has passed (the planned day is in 48 days), so
    // the next change is counted from today: 28 days → days 0 and 18 → 2 catheters + 1 spare.
    expect(ctx.firstChangeInDays).toBe(0);
    expect(suppliesFor({ changeIntervalDays: ctx.changeIntervalDays!, firstChangeInDays: ctx.firstChangeInDays! }, 28).lines[0]).toMatchObject({ item: "catheter", quantity: 3 });
  });

  it("spare catheters are a setting (default one): saved by the admin route, read by the supply request", async () => {
    const { PATCH: patchSettings } = await import("@/app/api/admin/settings/route");
    const admin = await sessionFor("admin");
    const set = (body: Record<string, unknown>) => call(patchSettings, "/api/admin/settings", { method: "PATCH", cookie: admin, body });
    try {
      expect((await set({ spareCatheters: 6 })).status).toBe(400);
      expect((await set({ spareCatheters: 2 })).status).toBe(200);
      const cookie = await sessionFor("communityNurse");
      const lines = suppliesFor({ changeIntervalDays: 84, spareCatheters: 2 }, 28).lines;
      const res = await call(createSupply, `/api/patients/${fx.patientId}/supply-requests`, {
        cookie,
        params: { patientId: fx.patientId },
        body: { periodDays: 28, include: { legBag: true, valve: false, nightBag: true, gel: true }, items: lines.map((l) => ({ item: l.item, quantity: l.quantity })) },
      });
      expect(res.status).toBe(201);
      // No change in the 28 days (next in 84), two spares: 2 catheters and 2 gels (common practice, no source).
      const { supplyRequest } = await res.json();
      expect(supplyRequest.items.find((i: { item: string }) => i.item === "catheter")).toMatchObject({ computed: 2 });
      expect(supplyRequest.items.find((i: { item: string }) => i.item === "gel")).toMatchObject({ computed: 2 });
    } finally {
      await set({ spareCatheters: null });
    }
  });

  it("the e-mail names the gel used and, before a planned trial without catheter, says what the trial would make unnecessary", async () => {
    const [active] = await db.select().from(catheterEpisodes).where(and(eq(catheterEpisodes.patientId, fx.patientId), isNull(catheterEpisodes.removedAt)));
    await db.update(catheterEpisodes).set({ gelKind: "lidocaine-chlorhexidine", twocPlannedOn: "2030-01-15" }).where(eq(catheterEpisodes.id, active.id));
    try {
      const lines = suppliesFor({ changeIntervalDays: 84 }, 28).lines;
      const res = await call(createSupply, `/api/patients/${fx.patientId}/supply-requests`, {
        cookie: await sessionFor("communityNurse"),
        params: { patientId: fx.patientId },
        body: { periodDays: 28, include: { legBag: true, valve: false, nightBag: true, gel: true }, items: lines.map((l) => ({ item: l.item, quantity: l.quantity })) },
      });
      expect(res.status).toBe(201);
      const { supplyRequest } = await res.json();
      const [msg] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, supplyRequest.message.id));
      expect(msg.text).toContain("Gel syringes: Lidocaine and chlorhexidine gel");
      expect(msg.text).toContain("A trial without catheter is planned for");
      expect(msg.text).toContain("no catheters, leg or night bags, valves or gel are needed after that day");
    } finally {
      await db.update(catheterEpisodes).set({ gelKind: active.gelKind, twocPlannedOn: null }).where(eq(catheterEpisodes.id, active.id));
    }
  });
});
