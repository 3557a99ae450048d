// What else happens when a passport is issued, in the same transaction: the GP summary queued
// in the outbox (once per issue, issue 7 "on passport issue"), and, when asked for, a one-time
// portal activation code printed on a booklet that is never stored (only the code's HMAC is).
import { and, eq, isNull, like, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as activate } from "@/app/api/activate/route";
import { GET as getPdf } from "@/app/api/patients/[patientId]/passport/pdf/route";
import { POST as postPassport } from "@/app/api/patients/[patientId]/passport/route";
import { db } from "@/db";
import { auditEvents, outboundMessages, passports, patientInvites, patients } from "@/db/schema";
import { gpSummaryKey, queueGpSummary } from "@/lib/email/gp-summary";
import { hashActivationCode } from "@/lib/auth/secret-codes";
import en from "@/messages/en.json";
import pl from "@/messages/pl.json";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { PDFParse } = require("pdf-parse") as typeof import("pdf-parse");

async function pdfText(pdf: Buffer) {
  const parser = new PDFParse({ data: pdf });
  try {
    const r = await parser.getText();
    return r.text.normalize("NFKC").replace(/[\u0000-\u0008\u000b-\u001f\u061c\u200e\u200f]/g, "").replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

let halina: string;
let arthur: string;
let nurse: string;

const issue = (patientId: string, body: unknown, cookie = nurse) =>
  call(postPassport, `/api/patients/${patientId}/passport`, { cookie, body, params: { patientId } });

async function passportSummaries(patientId: string) {
  return db
    .select({ key: outboundMessages.idempotencyKey, sourceId: outboundMessages.sourceId, kind: outboundMessages.kind })
    .from(outboundMessages)
    .where(and(eq(outboundMessages.patientId, patientId), like(outboundMessages.idempotencyKey, "gp-summary:passport:%")));
}

async function count(table: typeof passports | typeof patientInvites, patientId: string) {
  const [r] = await db.select({ n: sql<number>`count(*)::int` }).from(table).where(eq(table.patientId, patientId));
  return r.n;
}

beforeAll(async () => {
  halina = await patientIdByHrn("EM-100-002");
  arthur = await patientIdByHrn("EM-100-001");
  nurse = await sessionFor("communityNurse");
});

describe("GP summary on passport issue", () => {
  it("queues exactly one GP summary per issue and one per reissue, keyed by the passport", async () => {
    expect(await passportSummaries(halina)).toHaveLength(0);
    const first = await (await issue(halina, {})).json();
    expect(first.gpSummaryQueued).toBe(true);
    let rows = await passportSummaries(halina);
    expect(rows).toEqual([{ key: gpSummaryKey({ cause: "passport", passportId: first.passport.id }), sourceId: first.passport.id, kind: "gp-summary" }]);

    const second = await (await issue(halina, { reissue: true })).json();
    rows = await passportSummaries(halina);
    expect(rows).toHaveLength(2);
    expect(rows.map((r) => r.sourceId).sort()).toEqual([first.passport.id, second.passport.id].sort());
  });

  it("queueing again for the same passport adds nothing (idempotent)", async () => {
    const [current] = await db.select().from(passports).where(and(eq(passports.patientId, halina), isNull(passports.revokedAt)));
    const before = (await passportSummaries(halina)).length;
    const again = await db.transaction((tx) => queueGpSummary(tx, { patientId: halina, passportId: current.id, cause: "passport", actorName: "Grace Mensah" }));
    expect(again.created).toBe(false);
    expect(await passportSummaries(halina)).toHaveLength(before);
  });

  it("a refused issue (409) queues nothing and issues nothing", async () => {
    const before = { mail: (await passportSummaries(halina)).length, passports: await count(passports, halina) };
    expect((await issue(halina, {})).status).toBe(409);
    expect((await passportSummaries(halina)).length).toBe(before.mail);
    expect(await count(passports, halina)).toBe(before.passports);
  });
});

describe("portal activation code on the booklet", () => {
  let code: string;
  let oneTime: Buffer;

  it("prints a fresh code on a booklet sent once; only its HMAC is stored", async () => {
    const res = await issue(halina, { reissue: true, activationCode: true });
    expect(res.status).toBe(201);
    const body = await res.json();
    expect(body.activation.code).toMatch(/^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/);
    expect(body.activation.activateUrl).toMatch(/\/pl\/activate$/);
    code = body.activation.code;
    oneTime = Buffer.from(body.activation.pdfBase64, "base64");
    expect(oneTime.subarray(0, 5).toString("latin1")).toBe("%PDF-");

    const live = await db.select().from(patientInvites).where(and(eq(patientInvites.patientId, halina), isNull(patientInvites.usedAt), isNull(patientInvites.revokedAt)));
    expect(live).toHaveLength(1);
    expect(live[0].codeHash).toBe(hashActivationCode(code));
    const raw = code.replaceAll("-", "");
    expect(JSON.stringify(await db.select().from(patientInvites))).not.toContain(raw);
    const audits = JSON.stringify(await db.select().from(auditEvents).where(eq(auditEvents.patientId, halina)));
    expect(audits).toContain(live[0].id);
    expect(audits).not.toContain(raw);
  });

  it("the one-time booklet carries the code in Polish and English; the stored booklet does not", async () => {
    const text = await pdfText(oneTime);
    // Letter-spaced big type can come back from the text layer with a space inside ("KT T4").
    const squashed = (t: string) => t.replace(/\s/g, "");
    expect(squashed(text)).toContain(code);
    expect(text).toContain(pl.PassportPdf.portalTitle);
    expect(text).toContain(en.PassportPdf.portalTitle);
    const stored = await call(getPdf, `/api/patients/${halina}/passport/pdf`, { cookie: nurse, params: { patientId: halina } });
    const storedText = await pdfText(Buffer.from(await stored.arrayBuffer()));
    expect(storedText).toContain(en.PassportPdf.title);
    expect(squashed(storedText)).not.toContain(code);
    expect(storedText).not.toContain(en.PassportPdf.portalTitle);
  });

  it("a second code on a reissue replaces the first", async () => {
    const body = await (await issue(halina, { reissue: true, activationCode: true })).json();
    expect(body.activation.code).not.toBe(code);
    const live = await db.select().from(patientInvites).where(and(eq(patientInvites.patientId, halina), isNull(patientInvites.usedAt), isNull(patientInvites.revokedAt)));
    expect(live.map((i) => i.codeHash)).toEqual([hashActivationCode(body.activation.code)]);
    code = body.activation.code;
  });

  it("the printed code activates the portal account", async () => {
    const res = await call(activate, "/api/activate", {
      body: { code, email: "halina.booklet@eastmere.example", password: "a-long-booklet-password" },
      headers: { [CLIENT_ADDRESS_HEADER]: "203.0.113.77" },
    });
    expect(res.status).toBe(201);
    const [p] = await db.select({ userId: patients.userId }).from(patients).where(eq(patients.id, halina));
    expect(p.userId).toBeTruthy();
  });

  it("refused (409) once the patient has an account: no passport, no code, no GP summary written", async () => {
    for (const patientId of [halina, arthur]) {
      const before = { p: await count(passports, patientId), i: await count(patientInvites, patientId), m: (await passportSummaries(patientId)).length };
      const res = await issue(patientId, { reissue: true, activationCode: true });
      expect(res.status).toBe(409);
      expect((await res.json()).error.fields.activationCode).toEqual(["has_account"]);
      expect(await count(passports, patientId)).toBe(before.p);
      expect(await count(patientInvites, patientId)).toBe(before.i);
      expect((await passportSummaries(patientId)).length).toBe(before.m);
    }
  });

  it("400 for a non-boolean choice, nothing written", async () => {
    const before = await count(passports, halina);
    const res = await issue(halina, { reissue: true, activationCode: "yes" });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.activationCode).toBeTruthy();
    expect(await count(passports, halina)).toBe(before);
  });
});
