// The app server keeps no state: two instances on one PostgreSQL share sessions and the
// sign-in rate limit (README.md, "Past one machine").
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { freePort } from "../support/mail";
import { baseUrl } from "./support/browser";

const root = path.resolve(__dirname, "../..");
const second = new URL(baseUrl);
let secondUrl = "";
let server: ChildProcess;

async function up(url: string) {
  for (let i = 0; i < 240; i++) {
    try {
      if ((await fetch(`${url}/en/sign-in`)).ok) return;
    } catch {
      /* starting */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not start`);
}

beforeAll(async () => {
  // A free port, not E2E_PORT + 1: on a shared machine that may be another engineer's server.
  second.port = String(await freePort());
  secondUrl = second.origin;
  server = spawn(path.join(root, "node_modules/.bin/next"), ["start", "-p", second.port, "-H", "127.0.0.1"], {
    cwd: root,
    // Same public address and secret as the first instance, as behind one load balancer.
    env: { ...process.env, APP_URL: baseUrl, BETTER_AUTH_SECRET: process.env.E2E_APP_SECRET, NODE_ENV: "production" },
    stdio: "ignore",
  });
  await up(secondUrl);
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
