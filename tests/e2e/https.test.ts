// Served over https (APP_URL https, ASVS 5.0.0 3.3.1, 3.4.1): an app instance behind a local TLS
// terminator with a throwaway certificate made here (openssl from Debian, installed by
// scripts/ensure-tools.ts). Its auth cookies are `__Host-` (Secure, HttpOnly, Path=/, no Domain),
// every answer carries HSTS, and plain http is redirected to https — also when a client that is
// not the listed proxy claims X-Forwarded-Proto: https.
import { execFileSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import http from "node:http";
import https from "node:https";
import os from "node:os";
import path from "node:path";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawnAppServer, waitForApp } from "../../scripts/app-server";
import { demo, totpCode } from "../support/http";
import { freePort } from "../support/mail";
import { totpSecretFor } from "../support/totp";
import { launch, newPage, screenshot, signInAs } from "./support/browser";

// The terminator reaches the app from 127.0.0.2, the one address the app trusts as its proxy;
// a request straight from 127.0.0.1 is an ordinary client.
const PROXY_ADDRESS = "127.0.0.2";
const CLIENT_ADDRESS = "127.0.0.3";
let dir = "";
let cert: Buffer;
let appPort = 0;
let tlsPort = 0;
let httpPort = 0;
let origin = "";
let app: ChildProcess;
const listeners: (http.Server | https.Server)[] = [];

/** A reverse proxy that appends the client to X-Forwarded-For and says which scheme it was reached on. */
function terminator(proto: "https" | "http") {
  return (req: http.IncomingMessage, res: http.ServerResponse) => {
    const forwardedFor = [req.headers["x-forwarded-for"], req.socket.remoteAddress].filter(Boolean).join(", ");
    const upstream = http.request(
      { host: "127.0.0.1", port: appPort, localAddress: PROXY_ADDRESS, method: req.method, path: req.url, headers: { ...req.headers, "x-forwarded-for": forwardedFor, "x-forwarded-proto": proto } },
      (up) => {
        res.writeHead(up.statusCode ?? 502, up.headers);
        up.pipe(res);
      },
    );
    upstream.on("error", () => {
      res.writeHead(502);
      res.end();
    });
    req.pipe(upstream);
  };
}

type Answer = { status: number; headers: http.IncomingHttpHeaders; body: string };

/** One request, over https with the throwaway certificate as the only trusted CA, or plain http. */
function send(url: string, { method = "GET", headers = {}, body }: { method?: string; headers?: Record<string, string>; body?: unknown } = {}): Promise<Answer> {
  const u = new URL(url);
  const payload = body === undefined ? undefined : JSON.stringify(body);
  const options = {
    method,
    hostname: u.hostname,
    port: u.port,
    path: u.pathname + u.search,
    headers: { ...(payload ? { "content-type": "application/json", "content-length": String(Buffer.byteLength(payload)) } : {}), ...headers },
    ...(u.protocol === "https:" ? { ca: cert, servername: u.hostname } : {}),
    // From a loopback address of this file's own, so the per-address limits it meets are its own.
    localAddress: CLIENT_ADDRESS,
  };
  return new Promise((resolve, reject) => {
    const req = (u.protocol === "https:" ? https : http).request(options, (res) => {
      let text = "";
      res.setEncoding("utf8");
      res.on("data", (c) => (text += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: text }));
    });
    req.on("error", reject);
    if (payload) req.write(payload);
    req.end();
  });
}

const setCookies = (a: Answer) => a.headers["set-cookie"] ?? [];
const pairs = (a: Answer) => setCookies(a).map((c) => c.split(";")[0]!).join("; ");

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-tls-"));
  execFileSync("openssl", [
    "req", "-x509", "-newkey", "rsa:2048", "-nodes", "-sha256", "-days", "1",
    "-keyout", path.join(dir, "key.pem"), "-out", path.join(dir, "cert.pem"),
    "-subj", "/CN=localhost", "-addext", "subjectAltName=DNS:localhost,IP:127.0.0.1",
  ], { stdio: "ignore" });
  cert = fs.readFileSync(path.join(dir, "cert.pem"));
  const key = fs.readFileSync(path.join(dir, "key.pem"));
  [appPort, tlsPort, httpPort] = [await freePort(), await freePort(), await freePort()];
  origin = `https://localhost:${tlsPort}`;
  app = spawnAppServer({
    port: appPort,
    env: { ...process.env, APP_URL: origin, BETTER_AUTH_SECRET: process.env.E2E_APP_SECRET, TRUSTED_PROXIES: PROXY_ADDRESS, NODE_ENV: "production", CADDIS_BACKGROUND: "off" },
    stdio: "ignore",
  });
  const tls = https.createServer({ key, cert }, terminator("https"));
  const plain = http.createServer(terminator("http"));
  await new Promise<void>((r) => tls.listen(tlsPort, "127.0.0.1", r));
  await new Promise<void>((r) => plain.listen(httpPort, "127.0.0.1", r));
  listeners.push(tls, plain);
  // Up when the app answers (with its redirect: this request is plain http from a client).
  await waitForApp(`http://127.0.0.1:${appPort}`, 90);
}, 120_000);

afterAll(async () => {
  app?.kill("SIGTERM");
  for (const l of listeners) l.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("over https", () => {
  it("sends HSTS for at least a year with every page", async () => {
    const page = await send(`${origin}/en/sign-in`);
    expect(page.status).toBe(200);
    const hsts = String(page.headers["strict-transport-security"]);
    expect(Number(/max-age=(\d+)/.exec(hsts)?.[1])).toBeGreaterThanOrEqual(31_536_000);
  });

  it("sets the session cookie as __Host-: Secure, HttpOnly, Path=/, SameSite, no Domain — and it works", async () => {
    const res = await send(`${origin}/api/auth/sign-in/email`, { method: "POST", headers: { origin }, body: demo.patient });
    expect(res.status).toBe(200);
    const session = setCookies(res).find((c) => c.includes("session_token"))!;
    expect(session).toMatch(/^__Host-caddis\.session_token=/);
    expect(session).toMatch(/;\s*Secure/i);
    expect(session).toMatch(/;\s*HttpOnly/i);
    expect(session).toMatch(/;\s*Path=\//i);
    expect(session).toMatch(/;\s*SameSite=Lax/i);
    expect(session).not.toMatch(/Domain=/i);
    expect(res.body).not.toMatch(/"token"/);
    const me = await send(`${origin}/api/me`, { headers: { cookie: pairs(res) } });
    expect(me.status).toBe(200);
    expect(JSON.parse(me.body).email).toBe(demo.patient.email);
    // The http name is not accepted in its place.
    const renamed = pairs(res).replace("__Host-caddis.session_token", "caddis.session_token");
    expect((await send(`${origin}/api/me`, { headers: { cookie: renamed } })).status).toBe(401);
  });

  it("gives every other auth cookie of a staff sign-in the same prefix and flags (second step, known device)", async () => {
    const first = await send(`${origin}/api/auth/sign-in/email`, { method: "POST", headers: { origin }, body: demo.wardNurse });
    expect(JSON.parse(first.body)).toMatchObject({ twoFactorRedirect: true });
    const second = await send(`${origin}/api/auth/two-factor/verify-totp`, {
      method: "POST",
      headers: { origin, cookie: pairs(first) },
      body: { code: totpCode(totpSecretFor(demo.wardNurse.email)!) },
    });
    expect(second.status).toBe(200);
    const all = [...setCookies(first), ...setCookies(second)];
    const names = all.map((c) => c.split("=")[0]);
    expect(names).toEqual(expect.arrayContaining(["__Host-caddis.two_factor", "__Host-caddis.session_token", "__Host-caddis.known_device"]));
    for (const c of all) {
      expect(c.split("=")[0]).toMatch(/^__Host-caddis\./);
      expect(c).toMatch(/;\s*Secure/i);
      expect(c).toMatch(/;\s*HttpOnly/i);
      expect(c).toMatch(/;\s*Path=\//i);
      expect(c).not.toMatch(/Domain=/i);
    }
  });
});

describe("plain http", () => {
  it("is redirected to the same path on APP_URL over https, from the load balancer's http side", async () => {
    const res = await send(`http://127.0.0.1:${httpPort}/en/sign-in?next=%2Fen%2Ftoday`);
    expect(res.status).toBe(308);
    expect(res.headers.location).toBe(`${origin}/en/sign-in?next=%2Fen%2Ftoday`);
  });

  it("is redirected when it reaches the app directly, even claiming X-Forwarded-Proto: https (the client is not the proxy)", async () => {
    for (const headers of [{}, { "x-forwarded-proto": "https" }, { host: "evil.example" }] as Record<string, string>[]) {
      const res = await send(`http://127.0.0.1:${appPort}/api/me`, { headers });
      expect(res.status).toBe(308);
      // To APP_URL, never to the Host a client sent.
      expect(res.headers.location).toBe(`${origin}/api/me`);
    }
  });
});

describe("in Chromium over https", () => {
  let browser: Browser;
  beforeAll(async () => {
    // The throwaway certificate is not in Chromium's store; the test trusts it by that flag.
    browser = await launch(["--ignore-certificate-errors"]);
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a patient signs in through the page and the browser keeps only a Secure, HttpOnly __Host- session cookie", async () => {
    const page = await newPage(browser, { baseURL: origin, viewport: { width: 390, height: 844 } });
    await signInAs(page, demo.patient.email, demo.patient.password);
    expect(new URL(page.url()).pathname).toBe("/en/today");
    const cookies = await page.context().cookies(origin);
    const session = cookies.find((c) => c.name.endsWith("session_token"))!;
    expect(session).toMatchObject({ name: "__Host-caddis.session_token", secure: true, httpOnly: true, path: "/", sameSite: "Lax" });
    // Page JavaScript cannot see it.
    expect(await page.evaluate(() => document.cookie)).not.toContain("session_token");
    await page.goto("/en/more/sessions");
    await page.getByTestId("session").first().waitFor();
    await screenshot(page, "https-sessions-patient-390");
    await page.context().close();
  });
});
