// The app server keeps no state: two instances on one PostgreSQL share sessions and the
// sign-in rate limit (architecture.md, "past one machine").
import type { ChildProcess } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawnAppServer, waitForApp } from "../../scripts/app-server";
import { demo } from "../support/http";
import { signInOverHttp } from "../support/sign-in-over-http";
import { createStaff } from "../support/staff";
import { freePort } from "../support/mail";
import { baseUrl } from "./support/browser";

const second = new URL(baseUrl);
let secondUrl = "";
let server: ChildProcess;

beforeAll(async () => {
  // A free port, not E2E_PORT + 1: on a shared machine that may be another engineer's server.
  second.port = String(await freePort());
  secondUrl = second.origin;
  server = spawnAppServer({
    port: second.port,
    // Same public address, secret and trusted proxies as the first instance, as behind one load balancer.
    env: { ...process.env, APP_URL: baseUrl, BETTER_AUTH_SECRET: process.env.E2E_APP_SECRET, TRUSTED_PROXIES: process.env.E2E_TRUSTED_PROXIES, NODE_ENV: "production" },
    stdio: "ignore",
  });
  await waitForApp(secondUrl, 60);
});

afterAll(async () => {
  server?.kill("SIGTERM");
  const { pool } = await import("@/db");
  await pool.end().catch(() => {});
});

function signIn(url: string, email: string, password: string, ip: string) {
  return fetch(`${url}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: baseUrl, "x-forwarded-for": ip },
    body: JSON.stringify({ email, password }),
  });
}

describe("two app instances on one database", () => {
  it("a session made on one instance works on the other, and sign-out on one ends it on both", async () => {
    // The nurse signs in in two steps on the first instance.
    const cookie = await signInOverHttp({ baseUrl, ...demo.communityNurse, headers: { "x-forwarded-for": "10.66.0.1" } });
    const me = await fetch(`${secondUrl}/api/me`, { headers: { cookie } });
    expect(me.status).toBe(200);
    expect((await me.json()).email).toBe(demo.communityNurse.email);
    const out = await fetch(`${secondUrl}/api/auth/sign-out`, {
      method: "POST",
      headers: { cookie, origin: baseUrl, "content-type": "application/json" },
      body: "{}",
    });
    expect(out.status).toBe(200);
    expect((await fetch(`${baseUrl}/api/me`, { headers: { cookie } })).status).toBe(401);
  });

  it("counts sign-in attempts from one address across both instances", async () => {
    const ip = "10.66.0.2";
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      const url = i % 2 === 0 ? baseUrl : secondUrl;
      // A different (unknown) account each time, so only the per-address limit can answer 429.
      statuses.push((await signIn(url, `nobody.${i}.${Date.now().toString(36)}@testwick.example`, `wrong-password-${i}`, ip)).status);
    }
    // SIGN_IN_MAX_ATTEMPTS (10) per minute in all, whichever instance answered.
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });

  it("holds an account back on both instances once it has been guessed at on either", async () => {
    // An account of its own, so no other test meets the hold.
    const target = await createStaff({ role: "clinician", organisationIds: [] });
    const answers: { status: number; code?: string; second: boolean }[] = [];
    for (let i = 0; i < 12; i++) {
      // From twelve addresses, alternating instances: only the account's own count (in
      // PostgreSQL) can hold these back.
      const second = i % 2 === 1;
      const res = await signIn(second ? secondUrl : baseUrl, target.email, `wrong-password-${i}`, `10.66.1.${i + 1}`);
      answers.push({ status: res.status, code: ((await res.json().catch(() => ({}))) as { code?: string }).code, second });
    }
    expect(answers.slice(0, 5).map((a) => a.status)).toEqual([401, 401, 401, 401, 401]);
    expect(answers.filter((a) => a.status === 401).length).toBeLessThanOrEqual(8);
    expect(answers.some((a) => a.second && a.status === 429 && a.code === "ACCOUNT_DELAYED")).toBe(true);
  });
});
