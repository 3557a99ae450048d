// Passport card and visit access: token lookup (unknown = revoked), the PostgreSQL limiter, the
// 24-hour grant with its audit row, and the passport headers set in proxy.ts.
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as visitAccessPost } from "@/app/api/visit-access/route";
import { db } from "@/db";
import { findPatientAccess } from "@/db/queries/access";
import { auditEvents, passports, patients, user } from "@/db/schema";
import { CARD_LIMIT, openDeviceCard } from "@/lib/qr/device-card";
import { generateShortCode, generateToken, hashShortCode, hashToken } from "@/lib/qr/passport-token";
import { withPassportHeaders } from "@/lib/passport-headers";
import { call, sessionFor } from "../support/http";

let patientId: string;
const current = generateToken();
const revoked = generateToken();

beforeAll(async () => {
  const [arthur] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  patientId = arthur!.id;
  await db.delete(passports).where(eq(passports.patientId, patientId));
  await db.insert(passports).values([
    { patientId, tokenHash: hashToken(revoked), shortCodeHash: hashShortCode(generateShortCode()), languages: ["en"], revokedAt: new Date() },
    { patientId, tokenHash: hashToken(current), shortCodeHash: hashShortCode(generateShortCode()), languages: ["en"] },
  ]);
});

const from = (ip: string) => ({ headers: new Headers({ "x-forwarded-for": ip }) });

describe("device card", () => {
  it("shows the device and allergies, nothing that names the patient, and audits the view", async () => {
    const r = await openDeviceCard({ token: current, request: from("10.50.0.1"), viewer: null });
    expect(r.kind).toBe("ok");
    if (r.kind !== "ok") return;
    expect(r.card.device?.sizeCh).toBeGreaterThan(0);
    const text = JSON.stringify(r.card);
    expect(text).not.toMatch(/Arthur|Pell|EM-100-001/);
    const rows = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, patientId), eq(auditEvents.action, "passport.card.view")));
    expect(rows.at(-1)?.via).toBe("qr");
    expect(rows.at(-1)?.ipHash).toMatch(/^[0-9a-f]{32}$/);
  });

  it("gives a revoked token (after reissue) and an unknown one the same answer", async () => {
    const a = await openDeviceCard({ token: revoked, request: from("10.50.0.2"), viewer: null });
    const b = await openDeviceCard({ token: generateToken(), request: from("10.50.0.2"), viewer: null });
    expect(a).toEqual({ kind: "invalid" });
    expect(b).toEqual(a);
  });

  it("limits requests per address and reports it", async () => {
    const results = [];
    for (let i = 0; i <= CARD_LIMIT.max; i++) results.push((await openDeviceCard({ token: generateToken(), request: from("10.50.0.3"), viewer: null })).kind);
    expect(results.slice(0, CARD_LIMIT.max).every((k) => k === "invalid")).toBe(true);
    expect(results.at(-1)).toBe("limited");
    // Another address is not affected.
    expect((await openDeviceCard({ token: current, request: from("10.50.0.4"), viewer: null })).kind).toBe("ok");
  });

  it("sends no-referrer, no-store and noindex on /p/… (proxy.ts), redirects included", () => {
    for (const path of ["/p/abc", "/en/p/abc", "/ar/p"]) {
      // A 307 as next-intl sends for /p/… → /en/p/…
      const res = withPassportHeaders(path, new Response(null, { status: 307, headers: { location: "/en/p/abc" } }));
      expect(res.headers.get("referrer-policy")).toBe("no-referrer");
      expect(res.headers.get("cache-control")).toBe("no-store");
      expect(res.headers.get("x-robots-tag")).toBe("noindex");
    }
    const other = withPassportHeaders("/en/sign-in", new Response(null));
    expect(other.headers.get("x-robots-tag")).toBeNull();
  });
});

describe("visit access", () => {
  it("grants another organisation's clinician 24 hours after a reason, audited with the reason", async () => {
    const cookie = await sessionFor("rowanNurse");
    const [rowan] = await db.select({ id: user.id }).from(user).where(eq(user.email, "rowan.nurse@eastmere.example"));
    expect(await findPatientAccess({ userId: rowan!.id, role: "clinician", patientId })).toBeNull();

    const short = await call(visitAccessPost, "/api/visit-access", { cookie, body: { token: current, reason: "short" } });
    expect(short.status).toBe(400);
    const bad = await call(visitAccessPost, "/api/visit-access", { cookie, body: { token: revoked, reason: "Out-of-hours visit for bypassing" } });
    expect(bad.status).toBe(404);
    expect(await findPatientAccess({ userId: rowan!.id, role: "clinician", patientId })).toBeNull();

    const ok = await call(visitAccessPost, "/api/visit-access", { cookie, body: { token: current, reason: "Out-of-hours visit for bypassing" } });
    expect(ok.status).toBe(201);
    const body = await ok.json();
    expect(body.patientId).toBe(patientId);
    const hours = (new Date(body.expiresAt).getTime() - Date.now()) / 3600_000;
    expect(hours).toBeGreaterThan(23.9);
    expect(hours).toBeLessThanOrEqual(24);
    expect(await findPatientAccess({ userId: rowan!.id, role: "clinician", patientId })).toBe("visit_access");
    const [row] = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, patientId), eq(auditEvents.action, "visit-access.grant")));
    expect(row?.reason).toBe("Out-of-hours visit for bypassing");
    expect(row?.actorUserId).toBe(rowan!.id);
  });

  it("refuses patients, carers and admins", async () => {
    for (const who of ["patient", "carer", "admin"] as const) {
      const res = await call(visitAccessPost, "/api/visit-access", { cookie: await sessionFor(who), body: { token: current, reason: "Out-of-hours visit for bypassing" } });
      expect(res.status).toBe(403);
    }
    const anon = await call(visitAccessPost, "/api/visit-access", { body: { token: current, reason: "Out-of-hours visit for bypassing" } });
    expect(anon.status).toBe(401);
  });
});
