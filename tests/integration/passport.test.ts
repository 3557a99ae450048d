// The passport: issue and reissue (one unrevoked passport, the old token dead at once), only
// hashes stored (ASVS 11.5.1 for the token, 16.2.5 for what the audit log keeps), the booklet
// stored at issue and streamed later, and who may do any of it (ASVS 8.2.1, 8.2.2).
import { and, eq, isNull, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getPdf } from "@/app/api/patients/[patientId]/passport/pdf/route";
import { GET as getPassport, POST as postPassport } from "@/app/api/patients/[patientId]/passport/route";
import { db } from "@/db";
import { auditEvents, passports } from "@/db/schema";
import {
  findPassportByShortCode,
  findPassportByToken,
  hashShortCode,
  hashToken,
  passportPdfKey,
  SHORT_CODE_ALPHABET,
  sha256Hex,
} from "@/lib/passport";
import { headObject } from "@/lib/storage";
import { patientIdByHrn } from "../support/fixtures";
import { call, origin, sessionFor } from "../support/http";

let halina: string;
let arthur: string;
let nurse: string;

const issue = (patientId: string, body: unknown, cookie = nurse) =>
  call(postPassport, `/api/patients/${patientId}/passport`, { cookie, body, params: { patientId } });

async function passportCount(patientId: string) {
  const [r] = await db.select({ n: sql<number>`count(*)::int` }).from(passports).where(eq(passports.patientId, patientId));
  return r.n;
}

beforeAll(async () => {
  halina = await patientIdByHrn("EM-100-002");
  arthur = await patientIdByHrn("EM-100-001");
  nurse = await sessionFor("communityNurse");
});

describe("POST /api/patients/[patientId]/passport", () => {
  let first: { url: string; shortCode: string; qrSvg: string; passport: { id: string; languages: string[] } };

  it("issues Halina Nowak's passport: token address, grouped short code, QR, Polish and English", async () => {
    const res = await issue(halina, {});
    expect(res.status).toBe(201);
    first = await res.json();
    expect(first.url).toMatch(new RegExp(`^${origin}/p/[A-Za-z0-9_-]{43}$`));
    expect(first.shortCode).toMatch(new RegExp(`^[${SHORT_CODE_ALPHABET}]{4}-[${SHORT_CODE_ALPHABET}]{4}-[${SHORT_CODE_ALPHABET}]{5}$`));
    expect(first.qrSvg.trim().startsWith("<svg")).toBe(true);
    expect(first.passport.languages).toEqual(["pl", "en"]);
    // The booklet is in the store under the passport's own key.
    expect(await headObject({ key: passportPdfKey({ patientId: halina, passportId: first.passport.id }) })).toMatchObject({
      contentType: "application/pdf",
    });
  });

  it("stores only hashes (SHA-256 of the token, keyed HMAC of the code): no column and no audit detail holds the plain token or code", async () => {
    const token = first.url.split("/p/")[1];
    const code = first.shortCode.replaceAll("-", "");
    const [row] = await db.select().from(passports).where(eq(passports.id, first.passport.id));
    expect(row.tokenHash).toBe(sha256Hex(token));
    expect(row.tokenHash).toBe(hashToken(token));
    expect(row.shortCodeHash).toBe(hashShortCode(first.shortCode));
    const everything = JSON.stringify(await db.select().from(passports));
    expect(everything).not.toContain(token);
    expect(everything).not.toContain(code);
    const audits = JSON.stringify(await db.select().from(auditEvents).where(eq(auditEvents.action, "passport.issue")));
    expect(audits).toContain(first.passport.id);
    expect(audits).not.toContain(token);
    expect(audits).not.toContain(code);
  });

  it("finds the passport by its token and by the typed code (any case, with or without dashes)", async () => {
    const token = first.url.split("/p/")[1];
    expect(await findPassportByToken(token)).toMatchObject({ passportId: first.passport.id, patientId: halina });
    expect(await findPassportByShortCode(first.shortCode.toLowerCase().replaceAll("-", " "))).toMatchObject({ patientId: halina });
    // One character changed: nothing.
    const flipped = token.slice(0, -1) + (token.endsWith("A") ? "B" : "A");
    expect(await findPassportByToken(flipped)).toBeNull();
    expect(await findPassportByToken("not-a-token")).toBeNull();
  });

  it("refuses to replace a passport without an explicit reissue (409), and writes nothing", async () => {
    const before = await passportCount(halina);
    const res = await issue(halina, {});
    expect(res.status).toBe(409);
    expect((await res.json()).error.fields.reissue).toEqual(["confirm_reissue"]);
    expect(await passportCount(halina)).toBe(before);
  });

  it("400 with field errors for bad input, and nothing written", async () => {
    const before = await passportCount(halina);
    for (const body of [{ reissue: "yes" }, { reissue: true, token: "mine" }, []]) {
      const res = await issue(halina, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect((await res.json()).error.code).toBe("validation_failed");
    }
    const res = await call(postPassport, `/api/patients/${halina}/passport`, {
      cookie: nurse,
      rawBody: "{not json",
      headers: { "content-type": "application/json" },
      params: { patientId: halina },
    });
    expect(res.status).toBe(400);
    expect(await passportCount(halina)).toBe(before);
  });

  it("reissues: a new token and code, the old passport revoked at once and its token dead", async () => {
    const oldToken = first.url.split("/p/")[1];
    const res = await issue(halina, { reissue: true });
    expect(res.status).toBe(201);
    const second = await res.json();
    expect(second.url).not.toBe(first.url);
    expect(second.shortCode).not.toBe(first.shortCode);
    expect(second.revokedIds).toEqual([first.passport.id]);
    const [old] = await db.select().from(passports).where(eq(passports.id, first.passport.id));
    expect(old.revokedAt).toBeInstanceOf(Date);
    expect(old.revokedAt!.getTime()).toBe(new Date(second.passport.issuedAt).getTime());
    expect(await findPassportByToken(oldToken)).toBeNull();
    expect(await findPassportByShortCode(first.shortCode)).toBeNull();
    expect(await findPassportByToken(second.url.split("/p/")[1])).toMatchObject({ passportId: second.passport.id });
    const current = await db.select().from(passports).where(and(eq(passports.patientId, halina), isNull(passports.revokedAt)));
    expect(current.map((p) => p.id)).toEqual([second.passport.id]);
  });

  it("two reissues at the same moment take turns: still exactly one current passport", async () => {
    const [a, b] = await Promise.all([issue(halina, { reissue: true }), issue(halina, { reissue: true })]);
    expect([a.status, b.status]).toEqual([201, 201]);
    const current = await db.select().from(passports).where(and(eq(passports.patientId, halina), isNull(passports.revokedAt)));
    expect(current).toHaveLength(1);
  });

  it("English only for an English-speaking patient", async () => {
    const res = await issue(arthur, {});
    expect(res.status).toBe(201);
    expect((await res.json()).passport.languages).toEqual(["en"]);
  });

  it("404 for another organisation's clinician; 401 anonymous; 403 patient, carer, admin; nothing written", async () => {
    const before = await passportCount(halina);
    expect((await issue(halina, { reissue: true }, await sessionFor("wardNurse"))).status).toBe(404);
    expect((await call(postPassport, `/api/patients/${halina}/passport`, { body: {}, params: { patientId: halina } })).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      expect((await issue(arthur, { reissue: true }, await sessionFor(who))).status, who).toBe(403);
    }
    expect(await passportCount(halina)).toBe(before);
  });
});

describe("GET /api/patients/[patientId]/passport", () => {
  it("gives the current passport and the revoked ones, never a token or a hash", async () => {
    const res = await call(getPassport, `/api/patients/${halina}/passport`, { cookie: nurse, params: { patientId: halina } });
    expect(res.status).toBe(200);
    const text = await res.text();
    const body = JSON.parse(text);
    expect(body.current).toMatchObject({ issuedByName: "Grace Mensah", languages: ["pl", "en"], revokedAt: null, outOfDate: false });
    expect(body.history.length).toBeGreaterThanOrEqual(4);
    expect(body.history.filter((p: { revokedAt: string | null }) => !p.revokedAt)).toHaveLength(1);
    expect(text).not.toMatch(/hash|token/i);
    const rows = await db.select({ h: passports.tokenHash }).from(passports).where(eq(passports.patientId, halina));
    for (const r of rows) expect(text).not.toContain(r.h);
  });

  it("says nothing is issued yet for a patient without a passport", async () => {
    const maria = await patientIdByHrn("EM-100-004");
    const res = await call(getPassport, `/api/patients/${maria}/passport`, { cookie: nurse, params: { patientId: maria } });
    expect(await res.json()).toEqual({ current: null, history: [] });
  });

  it("404 another organisation; 401 anonymous; 403 patient, carer, admin", async () => {
    const path = `/api/patients/${halina}/passport`;
    expect((await call(getPassport, path, { cookie: await sessionFor("wardNurse"), params: { patientId: halina } })).status).toBe(404);
    expect((await call(getPassport, path, { params: { patientId: halina } })).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      expect((await call(getPassport, path, { cookie: await sessionFor(who), params: { patientId: halina } })).status, who).toBe(403);
    }
  });
});

describe("GET /api/patients/[patientId]/passport/pdf", () => {
  it("streams the stored booklet as a download: attachment with the issue date, nosniff, no-store, audited", async () => {
    const res = await call(getPdf, `/api/patients/${halina}/passport/pdf`, { cookie: nurse, params: { patientId: halina } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="caddis-passport-\d{4}-\d{2}-\d{2}\.pdf"$/);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("cache-control")).toBe("no-store");
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const [downloads] = await db
      .select({ n: sql<number>`count(*)::int` })
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "passport.download"), eq(auditEvents.patientId, halina)));
    expect(downloads.n).toBeGreaterThanOrEqual(1);
  });

  it("404 when no passport was issued", async () => {
    const rosa = await patientIdByHrn("EM-100-005");
    const res = await call(getPdf, `/api/patients/${rosa}/passport/pdf`, { cookie: nurse, params: { patientId: rosa } });
    expect(res.status).toBe(404);
  });

  it("404 another organisation; 401 anonymous; 403 patient, carer, admin", async () => {
    const path = `/api/patients/${halina}/passport/pdf`;
    expect((await call(getPdf, path, { cookie: await sessionFor("wardNurse"), params: { patientId: halina } })).status).toBe(404);
    expect((await call(getPdf, path, { params: { patientId: halina } })).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      expect((await call(getPdf, path, { cookie: await sessionFor(who), params: { patientId: halina } })).status, who).toBe(403);
    }
  });
});
