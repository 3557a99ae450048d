// The app server keeps no state: two instances on one PostgreSQL share sessions and the
// sign-in rate limit (architecture.md, "past one machine").
import type { ChildProcess } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawnAppServer, waitForApp } from "../../scripts/app-server";
import { demo } from "../support/http";
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

afterAll(() => {
  server?.kill("SIGTERM");
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
    const res = await signIn(baseUrl, demo.communityNurse.email, demo.communityNurse.password, "10.66.0.1");
    expect(res.status).toBe(200);
    const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
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

  it("counts sign-in attempts across both instances", async () => {
    const ip = "10.66.0.2";
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++) {
      const url = i % 2 === 0 ? baseUrl : secondUrl;
      statuses.push((await signIn(url, demo.carer.email, `wrong-password-${i}`, ip)).status);
    }
    // SIGN_IN_MAX_ATTEMPTS (10) per minute in all, whichever instance answered.
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });
});
