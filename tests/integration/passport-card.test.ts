// The public device card (issue 5): token and short-code lookup (unknown = revoked after reissue),
// nothing that names the patient, an audit event per view with the hashed address and the
// signed-in user, the PostgreSQL limiter and its 429 page, the passport headers, and the 24-hour
// visit access with its reason, its expiry and its place in the access log.
// ASVS 8.2.2, 11.5.1, 14.2.1, 14.3.2, 3.4.5, 2.4.1, 16.2.1.
import { and, desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getAccessLog } from "@/app/api/patients/[patientId]/access-log/route";
import { GET as getPatient } from "@/app/api/patients/[patientId]/route";
import { POST as visitAccessPost } from "@/app/api/visit-access/route";
import { db } from "@/db";
import { findPatientAccess } from "@/db/queries/access";
import { auditEvents, visitAccess } from "@/db/schema";
import { getViewerFromHeaders, type Viewer } from "@/lib/auth/session";
import { generateToken, issuePassport, type IssuedPassport } from "@/lib/passport";
import { generateShortCode } from "@/lib/passport/tokens";
import { isCardPath, withSecretUrlHeaders } from "@/lib/http/secret-headers";
import { CARD_LIMIT, limitCardRequest } from "@/lib/qr/card-limit";
import { openDeviceCard } from "@/lib/qr/device-card";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

let arthur: string;
let nurse: Viewer;
let first: IssuedPassport;
let current: IssuedPassport;
const tokenOf = (p: IssuedPassport) => p.url.split("/p/")[1]!;
const from = (ip: string) => ({ headers: new Headers({ [CLIENT_ADDRESS_HEADER]: ip }) });

beforeAll(async () => {
  arthur = await patientIdByHrn("EM-100-001");
  nurse = (await getViewerFromHeaders(new Headers({ cookie: await sessionFor("communityNurse") })))!;
  // Issue, then reissue: the first token and code are revoked by the second issue.
  first = await issuePassport({ viewer: nurse, patientId: arthur });
  current = await issuePassport({ viewer: nurse, patientId: arthur });
}, 60_000);

describe("device card", () => {
  it("shows the device, the allergies that matter and the team phone, nothing that names the patient", async () => {
    const r = await openDeviceCard({ credential: tokenOf(current), request: from("10.50.0.1"), viewer: null });
    expect(r.kind).toBe("ok");
    if (r.kind !== "ok") return;
    expect(r.card.device).toMatchObject({ sizeCh: expect.any(Number), balloonMl: expect.any(Number), route: expect.any(String), plannedChangeOn: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/) });
    // Arthur Pell is the seeded latex-allergic patient.
    expect(r.card.allergies.latex).toBe("yes");
    // The lead team's numbers (getLeadTeamContact): Harbourside, with its own out-of-hours line.
    expect(r.card.careTeam).toMatchObject({ name: "Harbourside Community Nursing Team", phone: "01632 960 210", outOfHoursPhone: "01632 960 299" });
    // Before recatheterising: lot, expiry, whether the last insertion was difficult, valve or bag.
    expect(r.card.device).toHaveProperty("lot");
    expect(r.card.device).toHaveProperty("expiry");
    expect(typeof r.card.device?.difficult).toBe("boolean");
    expect(Object.keys(r.card).sort()).toEqual(["allergies", "careTeam", "device", "drainage", "patientLocale", "removal"]);
    const text = JSON.stringify(r.card);
    expect(text).not.toMatch(/Arthur|Pell|EM-100-001|19\d\d-\d\d-\d\d/);
  });

  it("audits every view with the hashed address, and the user when signed in (ASVS 16.2.1, 16.2.5)", async () => {
    await openDeviceCard({ credential: tokenOf(current), request: from("10.50.0.9"), viewer: null });
    await openDeviceCard({ credential: tokenOf(current), request: from("10.50.0.9"), viewer: nurse });
    const rows = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.patientId, arthur), eq(auditEvents.action, "passport.card.view")))
      .orderBy(desc(auditEvents.id))
      .limit(2);
    expect(rows[0]).toMatchObject({ via: "qr", actorUserId: nurse.userId, actorRole: "clinician" });
    expect(rows[1]).toMatchObject({ via: "qr", actorUserId: null });
    for (const r of rows) {
      expect(r.ipHash).toMatch(/^[0-9a-f]{32}$/);
      expect(r.ipHash).not.toContain("10.50.0.9");
      expect(JSON.stringify(r.details)).not.toContain(tokenOf(current));
    }
  });

  it("opens with the typed short code too, however it is written, and logs the view as by code", async () => {
    const typed = current.shortCode.toLowerCase().replace(/-/g, " ");
    const r = await openDeviceCard({ credential: typed, request: from("10.50.0.1"), viewer: nurse });
    expect(r.kind).toBe("ok");
    const [row] = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, arthur), eq(auditEvents.action, "passport.card.view"))).orderBy(desc(auditEvents.id)).limit(1);
    expect(row).toMatchObject({ via: "short_code", details: expect.objectContaining({ by: "short-code" }) });
  });

  it("tells a mistyped code apart: one symbol wrong, two swapped, or the wrong length → check the code", async () => {
    const code = current.shortCode.replace(/-/g, "");
    const other = (c: string) => (c === "A" ? "B" : "A");
    const mistyped = [
      other(code[5]) === code[5] ? code : code.slice(0, 5) + other(code[5]) + code.slice(6),
      code.slice(0, 2) + code[3] + code[2] + code.slice(4),
      code.slice(0, 11),
    ].filter((c) => c !== code && !(c.length === 13 && c[2] === c[3]));
    for (const credential of mistyped) {
      const r = await openDeviceCard({ credential, request: from("10.50.0.5"), viewer: null });
      expect(r, credential).toEqual({ kind: "typo" });
    }
    const [row] = await db.select().from(auditEvents).where(eq(auditEvents.action, "passport.card.typo")).orderBy(desc(auditEvents.id)).limit(1);
    expect(row).toMatchObject({ via: "short_code", patientId: null });
  });

  it("gives the revoked token and code (after reissue) and unknown ones one and the same answer", async () => {
    // An unknown code with a right check symbol, and one printed before check symbols existed.
    const unknown = generateShortCode();
    const answers = await Promise.all(
      [tokenOf(first), first.shortCode, generateToken(), unknown, unknown.slice(0, 12), "ABCD-EFGH-JKMN"].map((credential) =>
        openDeviceCard({ credential, request: from("10.50.0.2"), viewer: null }),
      ),
    );
    for (const a of answers) expect(a).toEqual({ kind: "invalid" });
    const rows = await db.select().from(auditEvents).where(eq(auditEvents.action, "passport.card.invalid"));
    expect(rows.length).toBeGreaterThanOrEqual(answers.length);
    expect(rows.every((r) => r.patientId === null)).toBe(true);
  });
});

describe("per-address limit (PostgreSQL, holds across instances)", () => {
  it("answers 429 with Retry-After and a plain page once an address is over the limit; others are unaffected", async () => {
    const statuses: (number | null)[] = [];
    for (let i = 0; i <= CARD_LIMIT.max; i++) statuses.push((await limitCardRequest(from("10.50.0.3"), "ar"))?.status ?? null);
    expect(statuses.slice(0, CARD_LIMIT.max).every((s) => s === null)).toBe(true);
    const limited = await limitCardRequest(from("10.50.0.3"), "ar");
    expect(limited?.status).toBe(429);
    expect(Number(limited?.headers.get("retry-after"))).toBeGreaterThan(0);
    const html = await limited!.text();
    expect(html).toContain('lang="ar" dir="rtl"');
    expect(html).toContain("Too many requests");
    expect(await limitCardRequest(from("10.50.0.4"), "en")).toBeNull();
  });

  it("covers the card and the code page, not the visit-access form", () => {
    expect(isCardPath("/en/p/abc")).toBe(true);
    expect(isCardPath("/ar/p")).toBe(true);
    expect(isCardPath("/en/p/abc/visit")).toBe(false);
    expect(isCardPath("/en/caseload")).toBe(false);
  });
});

describe("secret-URL headers (proxy.ts)", () => {
  it("sends no-referrer, no-store and noindex on /p/…, invitation and reset links, redirects and 429s included", () => {
    const paths = [
      ["/p/abc", 307], ["/en/p/abc", 200], ["/ar/p", 200], ["/en/p/abc/visit", 200], ["/en/p/abc", 429],
      ["/en/carer-invite/tok", 200], ["/carer-invite/tok", 307], ["/ur/accept-invite/tok", 200], ["/es/reset-password", 200],
    ] as const;
    for (const [path, status] of paths) {
      const res = withSecretUrlHeaders(path, new Response(null, { status }));
      expect(res.headers.get("referrer-policy")).toBe("no-referrer");
      expect(res.headers.get("cache-control")).toBe("no-store");
      expect(res.headers.get("x-robots-tag")).toBe("noindex");
    }
    for (const path of ["/en/sign-in", "/en/patients/abc", "/en/activate", "/en/forgot-password"]) {
      expect(withSecretUrlHeaders(path, new Response(null)).headers.get("x-robots-tag"), path).toBeNull();
    }
  });
});

describe("visit access", () => {
  const reason = "Out-of-hours visit for bypassing";

  it("refuses a short reason (400) and a revoked passport (404), granting nothing", async () => {
    const cookie = await sessionFor("rowanNurse");
    const short = await call(visitAccessPost, "/api/visit-access", { cookie, body: { token: tokenOf(current), reason: "short" } });
    expect(short.status).toBe(400);
    expect((await short.json()).error.fields.reason).toEqual(["too_short"]);
    const bad = await call(visitAccessPost, "/api/visit-access", { cookie, body: { token: tokenOf(first), reason } });
    expect(bad.status).toBe(404);
    const rowan = (await getViewerFromHeaders(new Headers({ cookie })))!;
    expect(await findPatientAccess({ userId: rowan.userId, role: "clinician", patientId: arthur })).toBeNull();
  });

  it("grants another organisation's clinician 24 hours, listed in the access log with the reason, and ends by itself", async () => {
    const cookie = await sessionFor("rowanNurse");
    const rowan = (await getViewerFromHeaders(new Headers({ cookie })))!;
    const ok = await call(visitAccessPost, "/api/visit-access", { cookie, body: { token: current.shortCode, reason } });
    expect(ok.status).toBe(201);
    const body = await ok.json();
    expect(body).toMatchObject({ patientId: arthur, via: "visit_access" });
    const hours = (new Date(body.expiresAt).getTime() - Date.now()) / 3600_000;
    expect(hours).toBeGreaterThan(23.9);
    expect(hours).toBeLessThanOrEqual(24);
    expect(await findPatientAccess({ userId: rowan.userId, role: "clinician", patientId: arthur })).toBe("visit_access");

    // The care team sees it in the access log: who, how, why.
    const log = await call(getAccessLog, `/api/patients/${arthur}/access-log`, { cookie: await sessionFor("communityNurse"), params: { patientId: arthur } });
    expect(log.status).toBe(200);
    const text = JSON.stringify(await log.json());
    expect(text).toContain("visit-access.grant");
    expect(text).toContain(reason);

    // 24 hours later (moved back in time here) the record is closed to them again: 404.
    await db.update(visitAccess).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(visitAccess.userId, rowan.userId));
    expect(await findPatientAccess({ userId: rowan.userId, role: "clinician", patientId: arthur })).toBeNull();
    const after = await call(getPatient, `/api/patients/${arthur}`, { cookie, params: { patientId: arthur } });
    expect(after.status).toBe(404);
  });

  it("needs no grant for the care team", async () => {
    const res = await call(visitAccessPost, "/api/visit-access", { cookie: await sessionFor("communityNurse"), body: { token: tokenOf(current), reason } });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ patientId: arthur, via: "care_team", expiresAt: null });
  });

  it("refuses patients, carers and admins (403) and anonymous callers (401)", async () => {
    for (const who of ["patient", "carer", "admin"] as const) {
      const res = await call(visitAccessPost, "/api/visit-access", { cookie: await sessionFor(who), body: { token: tokenOf(current), reason } });
      expect(res.status).toBe(403);
    }
    const anon = await call(visitAccessPost, "/api/visit-access", { body: { token: tokenOf(current), reason } });
    expect(anon.status).toBe(401);
  });
});
