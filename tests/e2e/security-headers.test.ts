// Security headers on every page of the production build (ASVS 3.4.1 HSTS, 3.4.3 CSP with
// object-src 'none', base-uri and nonces, 3.4.4 nosniff, 3.4.5 Referrer-Policy, 3.4.6
// frame-ancestors): each page under app/[locale], found on disk, requested as anonymous and as
// the role its page and layouts ask for, in a left-to-right and a right-to-left locale.
import { randomBytes } from "node:crypto";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LEARN_PAGES } from "@/lib/shared/learn";
import { RECORD_KINDS } from "@/lib/validations/episode";
import { demo } from "../support/http";
import { signInOverHttp } from "../support/sign-in-over-http";
import { expandPattern, listPages } from "../support/pages";
import { baseUrl } from "./support/browser";

const pages = listPages();
const accountFor: Record<string, keyof typeof demo> = { clinician: "communityNurse", admin: "admin", patient: "patient", carer: "carer" };
const referrerPolicies = ["no-referrer", "same-origin", "strict-origin", "strict-origin-when-cross-origin"];
const cookies = new Map<string, string>();
let values: Record<string, string[]>;
let ipN = 1;

async function signIn(who: keyof typeof demo) {
  const hit = cookies.get(who);
  if (hit) return hit;
  // Staff in two steps, with the code from their demo TOTP secret.
  const cookie = await signInOverHttp({ baseUrl, ...demo[who], headers: { "x-forwarded-for": `10.88.0.${ipN++}` } });
  cookies.set(who, cookie);
  return cookie;
}

beforeAll(async () => {
  const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await client.connect();
  const { rows } = await client.query<{ id: string }>("select id from patients where health_record_number = 'EM-100-001'");
  const org = await client.query<{ id: string }>("select id from organisations where name = 'Harbourside Community Nursing Team'");
  const staff = await client.query<{ id: string }>(`select id from "user" where email = 'community.nurse@eastmere.example'`);
  await client.end();
  values = {
    locale: ["en", "ar"],
    patientId: [rows[0].id],
    organisationId: [org.rows[0].id],
    userId: [staff.rows[0].id],
    kind: [...RECORD_KINDS],
    slug: [LEARN_PAGES[0].slug],
    // An invitation that does not exist: the page must answer (with its own message), headers and all.
    token: [randomBytes(24).toString("base64url")],
  };
});

afterAll(() => cookies.clear());

/**
 * The headers every HTML answer must carry; returns the CSP nonce. A plain document from a route
 * handler (the device card) allows no script at all instead.
 */
function expectSecurityHeaders(res: Response, where: string, plainDocument = false) {
  const csp = res.headers.get("content-security-policy");
  expect(csp, `${where}: Content-Security-Policy`).toBeTruthy();
  const directives = new Map(csp!.split(";").map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k, v]));
  expect(csp, `${where}: no 'unsafe-eval' in production`).not.toContain("unsafe-eval");
  expect(directives.get("frame-ancestors"), `${where}: frame-ancestors`).toEqual(["'none'"]);
  expect(directives.get("object-src"), `${where}: object-src`).toEqual(["'none'"]);
  expect(directives.get("base-uri"), `${where}: base-uri`).toBeTruthy();
  const scriptSrc = directives.get("script-src") ?? [];
  expect(scriptSrc, `${where}: no 'unsafe-inline' scripts`).not.toContain("'unsafe-inline'");
  const nonce = scriptSrc.find((s) => s.startsWith("'nonce-"))?.slice(7, -1);
  if (plainDocument) expect(scriptSrc, `${where}: a plain document runs no script`).toEqual(["'none'"]);
  else expect(nonce, `${where}: script-src carries a nonce`).toBeTruthy();
  const hsts = res.headers.get("strict-transport-security") ?? "";
  expect(Number(hsts.match(/max-age=(\d+)/)?.[1] ?? 0), `${where}: HSTS of a year or more`).toBeGreaterThanOrEqual(31_536_000);
  expect(res.headers.get("x-content-type-options"), `${where}: nosniff`).toBe("nosniff");
  expect(referrerPolicies, `${where}: Referrer-Policy`).toContain(res.headers.get("referrer-policy"));
  return nonce ?? "";
}

/**
 * Every script the page sends must carry the nonce, or the CSP blocks it and the page breaks.
 * A plain document from a route handler (the device card) must send no script at all.
 */
function expectNoncedScripts(html: string, nonce: string, where: string, plainDocument: boolean) {
  const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
  if (plainDocument) {
    expect(scripts, `${where}: a plain document has no script`).toEqual([]);
    return;
  }
  expect(scripts.length, `${where}: the page has scripts`).toBeGreaterThan(0);
  const without = scripts.filter((s) => !s.includes(`nonce="${nonce}"`));
  expect(without, `${where}: scripts without this response's nonce`).toEqual([]);
}

async function get(url: string, cookie?: string) {
  return fetch(`${baseUrl}${url}`, { redirect: "manual", headers: cookie ? { cookie } : {} });
}

describe("security headers on every page", () => {
  it("finds the pages under app/[locale] and a demo value for each dynamic segment", () => {
    expect(pages.length).toBeGreaterThan(15);
    for (const p of pages) expect(() => expandPattern(p.pattern, values), p.pattern).not.toThrow();
  });

  for (const page of pages) {
    it(`${page.pattern} (${page.roles ? page.roles.join("/") : "public"})`, { timeout: 120_000 }, async () => {
      for (const url of expandPattern(page.pattern, values)) {
        // Anonymous: the page itself, or the redirect to sign-in, carries the headers too.
        const anon = await get(url);
        expect(anon.status, `${url} anonymous`).toBeLessThan(500);
        const plain = page.file.endsWith("route.ts");
        expectSecurityHeaders(anon, `${url} anonymous (${anon.status})`, plain);
        if (anon.status === 200) expectNoncedScripts(await anon.text(), expectSecurityHeaders(anon, url, plain), `${url} anonymous`, plain);
        if (page.pattern.includes("[token]")) {
          // A secret in the path (invitation, QR card) never leaves in a Referer, nor sits in a cache.
          expect(anon.headers.get("referrer-policy"), `${url}: token page`).toBe("no-referrer");
          expect(anon.headers.get("cache-control") ?? "", `${url}: token page`).toContain("no-store");
          // Nor in any response header (next-intl's alternate-language Link header repeated it;
          // Next.js's own Link header preloads fonts and styles, which is fine).
          const patternParts = page.pattern.split("/");
          const secret = url.split("?")[0].split("/").find((_, i) => patternParts[i] === "[token]")!;
          for (const [name, value] of anon.headers) expect(value.includes(secret), `${url}: the token in the ${name} header`).toBe(false);
        }
        if (!page.roles) continue;
        expect([302, 303, 307, 308], `${url}: anonymous is sent to sign-in`).toContain(anon.status);
        expect(anon.headers.get("location") ?? "").toMatch(/\/sign-in$/);
        // As the role the page is for: a real page, with the headers and nonced scripts.
        // Staff record pages also need the care team (openRecordPage), so a clinician before an admin.
        const role = ["clinician", "patient", "carer", "admin"].find((r) => page.roles!.includes(r));
        expect(role, `${page.pattern}: a demo account for ${page.roles}`).toBeTruthy();
        const res = await get(url, await signIn(accountFor[role!]));
        const where = `${url} as ${role}`;
        expect(res.status, where).toBe(200);
        const nonce = expectSecurityHeaders(res, where, plain);
        expectNoncedScripts(await res.text(), nonce, where, plain);
        expect(res.headers.get("cache-control") ?? "", `${where}: not stored by shared caches`).toMatch(/no-store|private/);
      }
    });
  }

  it("the not-found page carries them too", async () => {
    const res = await get(`/en/no-such-page-${randomBytes(4).toString("hex")}`);
    expect(res.status).toBe(404);
    expectSecurityHeaders(res, "not found");
  });
});
