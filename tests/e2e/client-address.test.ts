// The client address comes from the connection, not from what the client says (ASVS 5.0.0
// 15.3.4, 2.4.1). An instance started as `npm start` starts it (no trusted proxy): rotating
// X-Forwarded-For, or forging the internal header, from one peer is limited as one address by
// every limiter. The suite's own server trusts loopback as its load balancer: there the proxy's
// header is honoured, right-most untrusted address first.
import type { ChildProcess } from "node:child_process";
import { randomUUID } from "node:crypto";
import { desc, eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, pool } from "@/db";
import { attemptCounters, rateLimit, session, user } from "@/db/schema";
import { CLIENT_ADDRESS_HEADER, hashIp } from "@/lib/http/client-ip";
import { spawnAppServer, waitForApp } from "../../scripts/app-server";
import { demo } from "../support/http";
import { freePort } from "../support/mail";
import { baseUrl } from "./support/browser";

let direct = "";
let server: ChildProcess;

beforeAll(async () => {
  const port = await freePort();
  direct = `http://localhost:${port}`;
  server = spawnAppServer({
    port,
    // As `npm start` runs it: no TRUSTED_PROXIES. Its own APP_URL, so origin checks pass.
    env: { ...process.env, APP_URL: direct, BETTER_AUTH_SECRET: process.env.E2E_APP_SECRET, TRUSTED_PROXIES: "", NODE_ENV: "production", CADDIS_BACKGROUND: "off" },
    stdio: "ignore",
  });
  await waitForApp(direct, 90);
}, 120_000);

afterAll(async () => {
  server?.kill("SIGTERM");
  // This file spends loopback's allowance on purpose (sign-in, card, activation); give it back
  // so the files after it, whose browsers also come from 127.0.0.1, start afresh.
  await db.delete(rateLimit).where(like(rateLimit.key, "127.0.0.1|%"));
  await db.delete(attemptCounters).where(like(attemptCounters.key, `%:${hashIp("127.0.0.1")}`));
  await pool.end().catch(() => {});
});

let n = 0;
/** A wrong password for an address nobody has, so only the per-address limit can answer 429. */
function wrongSignIn(url: string, headers: Record<string, string>) {
  return fetch(`${url}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: url, ...headers },
    body: JSON.stringify({ email: `nobody.${randomUUID().slice(0, 8)}@testwick.example`, password: `wrong-password-${n++}` }),
  });
}

async function lastSessionAddress(email: string) {
  const [row] = await db
    .select({ ip: session.ipAddress })
    .from(session)
    .innerJoin(user, eq(user.id, session.userId))
    .where(eq(user.email, email))
    .orderBy(desc(session.createdAt))
    .limit(1);
  return row?.ip;
}

/**
 * The answers of tries from one peer under a limit of `max` per window: refused (429) from the
 * (max + 1)th at the latest, and from then on. Other files' requests from loopback may already
 * have counted in the same window, so the first 429 may come sooner, never later.
 */
function expectOneAddress(statuses: number[], max: number) {
  const firstHeld = statuses.indexOf(429);
  expect(firstHeld, `429 by try ${max + 1}: ${statuses.join(" ")}`).toBeGreaterThanOrEqual(0);
  expect(firstHeld).toBeLessThanOrEqual(max);
  expect(statuses.slice(0, firstHeld)).not.toContain(429);
  expect(statuses.slice(firstHeld).every((s) => s === 429)).toBe(true);
}

describe("with no trusted proxy (the default)", () => {
  // First: the tests after it use up this peer's sign-in limit.
  it("records the TCP peer as the session's address, not the header", async () => {
    const res = await fetch(`${direct}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: direct, "x-forwarded-for": "198.51.100.200" },
      body: JSON.stringify(demo.patientAr),
    });
    expect(res.status).toBe(200);
    expect(await lastSessionAddress(demo.patientAr.email)).toBe("127.0.0.1");
  });

  it("limits sign-in from one peer however X-Forwarded-For and the internal header rotate", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      statuses.push((await wrongSignIn(direct, { "x-forwarded-for": `198.51.100.${i + 1}`, [CLIENT_ADDRESS_HEADER]: `203.0.113.${i + 1}` })).status);
    }
    // SIGN_IN_MAX_ATTEMPTS (10) a minute per address, whatever the headers said; the sign-in
    // above counted too.
    expectOneAddress(statuses, 10);
  });

  it("limits the device card and activation the same way", async () => {
    const card: number[] = [];
    for (let i = 0; i < 31; i++) {
      const res = await fetch(`${direct}/en/p/${randomUUID().replaceAll("-", "")}`, { headers: { "x-forwarded-for": `198.51.100.${i + 1}` } });
      card.push(res.status);
      await res.arrayBuffer();
    }
    expectOneAddress(card, 30);

    const activation: number[] = [];
    for (let i = 0; i < 11; i++) {
      const res = await fetch(`${direct}/api/activate`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: direct, "x-forwarded-for": `198.51.100.${i + 1}` },
        body: JSON.stringify({ code: `WRONG-${i}-CODE`, email: `nobody.${i}@testwick.example`, password: "Testwick-new-password-2026" }),
      });
      activation.push(res.status);
    }
    expectOneAddress(activation, 10);
  });

});

describe("behind a listed proxy (the suite's server trusts loopback)", () => {
  it("honours the proxy's header: different clients are counted apart", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) statuses.push((await wrongSignIn(baseUrl, { "x-forwarded-for": `192.0.2.${100 + i}` })).status);
    expect(statuses).not.toContain(429);
  });

  it("takes the right-most address the proxy did not vouch for, and ignores a forged internal header", async () => {
    const res = await fetch(`${baseUrl}/api/auth/sign-in/email`, {
      method: "POST",
      headers: {
        "content-type": "application/json",
        origin: baseUrl,
        // "198.51.100.1" was written by the client itself; 203.0.113.44 is what the proxy saw.
        "x-forwarded-for": "198.51.100.1, 203.0.113.44",
        [CLIENT_ADDRESS_HEADER]: "198.51.100.99",
      },
      body: JSON.stringify(demo.patient),
    });
    expect(res.status).toBe(200);
    expect(await lastSessionAddress(demo.patient.email)).toBe("203.0.113.44");
  });
});
