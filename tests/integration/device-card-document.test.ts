// The device card, its short-code form and its error answers as plain documents (issue 18): no
// script of any kind, no font file, at most 30 KB in all, both languages with the page's first,
// the same audit as before, and every value escaped. Through the route handlers themselves.
import { and, desc, eq } from "drizzle-orm";
import pg from "pg";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { GET as cardGet } from "@/app/[locale]/p/[token]/route";
import { GET as codeGet } from "@/app/[locale]/p/code/route";
import { GET as formGet } from "@/app/[locale]/p/route";
import { db } from "@/db";
import { auditEvents } from "@/db/schema";
import { getViewerFromHeaders } from "@/lib/auth/session";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";
import { issuePassport, type IssuedPassport } from "@/lib/passport";
import { hashToken } from "@/lib/passport/tokens";
import { html } from "@/lib/shared/html";
import { CARD_LIMIT } from "@/lib/qr/card-limit";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";
import { countQueries } from "../support/count-queries";

let yusuf: string;
let passport: IssuedPassport;
const tokenOf = (p: IssuedPassport) => p.url.split("/p/")[1]!;
const headers = { [CLIENT_ADDRESS_HEADER]: "10.61.0.1" };

async function card(locale: string, token: string) {
  const res = await call(cardGet, `/${locale}/p/${token}`, { headers, params: { locale, token } });
  return { res, body: await res.text() };
}

/** Everything a browser would fetch besides the document: scripts, stylesheets, fonts, images. */
function subresources(body: string) {
  return [...body.matchAll(/<(script|link|img|iframe|object)\b[^>]*>/gi)].map((m) => m[0]);
}

beforeAll(async () => {
  yusuf = await patientIdByHrn("EM-100-003");
  const nurse = (await getViewerFromHeaders(new Headers({ cookie: await sessionFor("communityNurse") })))!;
  passport = await issuePassport({ viewer: nurse, patientId: yusuf });
}, 60_000);

describe("the device card document", () => {
  it("is one HTML answer with no script, no font and nothing else to fetch, under 30 KB, in en and ar", async () => {
    for (const locale of ["en", "ar"]) {
      const { res, body } = await card(locale, tokenOf(passport));
      expect(res.status).toBe(200);
      expect(res.headers.get("content-type")).toBe("text/html; charset=utf-8");
      // Its own headers: the card's paths skip proxy.ts.
      expect(res.headers.get("content-security-policy")).toContain("script-src 'none'");
      expect(res.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");
      expect(res.headers.get("referrer-policy")).toBe("no-referrer");
      expect(res.headers.get("cache-control")).toBe("no-store");
      expect(res.headers.get("x-robots-tag")).toBe("noindex");
      expect(body).not.toMatch(/<script|javascript:|\son[a-z]+=/i);
      expect(body).not.toMatch(/@font-face|\.woff|_next\//);
      expect(subresources(body)).toEqual([]);
      expect(Buffer.byteLength(body)).toBeLessThanOrEqual(30 * 1024);
      expect(body).toContain('data-testid="card-size"');
      expect(body).toMatch(/<style>[^<]*@media print/);
    }
  });

  it("puts the page's language first: English on /en, Arabic on /ar (the patient's language)", async () => {
    const en = (await card("en", tokenOf(passport))).body;
    expect(en.indexOf('data-testid="card-en"')).toBeGreaterThan(-1);
    expect(en.indexOf('data-testid="card-en"')).toBeLessThan(en.indexOf('data-testid="card-ar"'));
    expect(en).toMatch(/<html lang="en" dir="ltr">/);
    const ar = (await card("ar", tokenOf(passport))).body;
    expect(ar.indexOf('data-testid="card-ar"')).toBeLessThan(ar.indexOf('data-testid="card-en"'));
    expect(ar).toMatch(/<html lang="ar" dir="rtl">/);
    expect(ar).toMatch(/<section lang="ar" dir="rtl"/);
  });

  it("writes the same audit event as before for each view", async () => {
    const before = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, yusuf), eq(auditEvents.action, "passport.card.view")));
    await card("en", tokenOf(passport));
    const after = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, yusuf), eq(auditEvents.action, "passport.card.view"))).orderBy(desc(auditEvents.id));
    expect(after.length).toBe(before.length + 1);
  });

  it("records who scanned when signed in, and nobody for an anonymous scan, through the route", async () => {
    const cookie = await sessionFor("communityNurse");
    const nurse = (await getViewerFromHeaders(new Headers({ cookie })))!;
    const signedIn = await call(cardGet, `/en/p/${tokenOf(passport)}`, { headers, cookie, params: { locale: "en", token: tokenOf(passport) } });
    expect(signedIn.status).toBe(200);
    await card("en", tokenOf(passport));
    const rows = await db.select().from(auditEvents).where(and(eq(auditEvents.patientId, yusuf), eq(auditEvents.action, "passport.card.view"))).orderBy(desc(auditEvents.id)).limit(2);
    expect(rows[1]).toMatchObject({ via: "qr", actorUserId: nurse.userId, actorRole: nurse.role });
    expect(rows[0]).toMatchObject({ via: "qr", actorUserId: null, actorRole: null });
    expect(rows[0]!.details).toMatchObject({ passportId: passport.passport.id, by: "token" });
  });

  it("answers an unknown token with the one 'no longer valid' page, and a bad locale with 404", async () => {
    const { res, body } = await card("pl", "A".repeat(43));
    expect(res.status).toBe(200);
    expect(body).toContain('data-testid="card-invalid"');
    expect(body).not.toContain('data-testid="card-size"');
    expect(subresources(body)).toEqual([]);
    const bad = await call(cardGet, `/xx/p/${tokenOf(passport)}`, { headers, params: { locale: "xx", token: tokenOf(passport) } });
    expect(bad.status).toBe(404);
  });
});

describe("one round trip", () => {
  const audits = async (action: string) => (await db.select().from(auditEvents).where(eq(auditEvents.action, action))).length;

  it("an anonymous QR view costs one statement: limit, lookup, card and audit together", async () => {
    const views = await audits("passport.card.view");
    const { result, queries: count } = await countQueries(() => card("en", tokenOf(passport)));
    expect(result.res.status).toBe(200);
    expect(result.body).toContain('data-testid="card-size"');
    expect(count).toBe(1);
    expect(await audits("passport.card.view")).toBe(views + 1);
  });

  it("is a named prepared statement: a connection parses and plans it once, then only binds the values", async () => {
    const spy = vi.spyOn(pg.Client.prototype, "query");
    try {
      for (let i = 0; i < 3; i++) expect((await card("en", tokenOf(passport))).res.status).toBe(200);
      const sent = spy.mock.calls.map(([q]) => q as { name?: string; text?: string });
      expect(sent).toHaveLength(3);
      expect(new Set(sent.map((q) => q.name))).toEqual(new Set(["caddis_open_card_by_token"]));
      expect(new Set(sent.map((q) => q.text)).size).toBe(1);
      // Only the values travel with each scan; the token's hash is one of them, never in the text.
      expect(sent[0]!.text).not.toContain(hashToken(tokenOf(passport)));
      expect((sent[0] as { values?: unknown[] }).values).toContain(hashToken(tokenOf(passport)));
    } finally {
      spy.mockRestore();
    }
  });

  it("an unknown token costs one statement too, and its miss is audited without a patient", async () => {
    const misses = await audits("passport.card.invalid");
    const { result, queries: count } = await countQueries(() => card("en", "B".repeat(43)));
    expect(result.body).toContain('data-testid="card-invalid"');
    expect(count).toBe(1);
    const rows = await db.select().from(auditEvents).where(eq(auditEvents.action, "passport.card.invalid")).orderBy(desc(auditEvents.id));
    expect(rows.length).toBe(misses + 1);
    expect(rows[0]!.patientId).toBeNull();
    expect(rows[0]!.via).toBe("qr");
  });
});

describe("the short-code page", () => {
  const code = (locale: string, typed?: string) =>
    call(codeGet, `/${locale}/p/code${typed === undefined ? "" : `?code=${encodeURIComponent(typed)}`}`, { headers, params: { locale } }).then((r) => r.text());

  it("is a GET form, the same for everyone (prerendered), that works without script; the right code shows the card", async () => {
    const form = await (await call(formGet, "/pl/p", { params: { locale: "pl" } })).text();
    expect(form).toMatch(/<form method="get" action="\/pl\/p\/code"/);
    expect(form).toMatch(/<html lang="pl" dir="ltr">/);
    expect(form).not.toMatch(/<script/i);
    const shown = await code("en", passport.shortCode);
    expect(shown).toContain('data-testid="card-size"');
  });

  it("says a mistyped code has a typing mistake, keeps what was typed, and escapes it", async () => {
    const typed = `"><b>x`;
    const body = await code("ar", typed);
    expect(body).toContain('data-testid="card-typo"');
    expect(body).toContain('value="&quot;&gt;&lt;b&gt;x"');
    expect(body).not.toContain("<b>x");
  });
});

describe("the per-address limit, counted by the handlers", () => {
  it("answers the card and the typed code with a real 429 page once an address is over the limit", async () => {
    const from = { [CLIENT_ADDRESS_HEADER]: "10.61.9.9" };
    const statuses: number[] = [];
    for (let i = 0; i < CARD_LIMIT.max; i++) {
      statuses.push((await call(cardGet, `/en/p/${tokenOf(passport)}`, { headers: from, params: { locale: "en", token: tokenOf(passport) } })).status);
    }
    expect(statuses.every((s) => s === 200)).toBe(true);
    const card = await call(cardGet, `/ar/p/${tokenOf(passport)}`, { headers: from, params: { locale: "ar", token: tokenOf(passport) } });
    expect(card.status).toBe(429);
    expect(card.headers.get("referrer-policy")).toBe("no-referrer");
    expect(card.headers.get("content-security-policy")).toContain("script-src 'none'");
    expect(Number(card.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(await card.text()).toMatch(/<html lang="ar" dir="rtl">/);
    const typed = await call(codeGet, `/en/p/code?code=${passport.shortCode}`, { headers: from, params: { locale: "en" } });
    expect(typed.status).toBe(429);
    expect((await call(cardGet, `/en/p/${tokenOf(passport)}`, { headers: { [CLIENT_ADDRESS_HEADER]: "10.61.9.10" }, params: { locale: "en", token: tokenOf(passport) } })).status).toBe(200);
  });
});

describe("html", () => {
  it("escapes every value and keeps its own markup", () => {
    expect(html`<p title="${`"'<>&`}">${"<script>"}${html`<i>ok</i>`}${[null, false, undefined, "a"]}</p>`.value).toBe(
      '<p title="&quot;&#39;&lt;&gt;&amp;">&lt;script&gt;<i>ok</i>a</p>',
    );
  });
});
