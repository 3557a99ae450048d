// Fault suite: PostgreSQL restarted during a burst of check-ins against a running production
// server. Every check-in answered 2xx is in the database; the others got a clear error
// (503 in the project's error shape) and none hung; the same server then takes check-ins again
// without being restarted, and resending the failed ones with their keys makes one row each.
// On a private cluster and a private server, so nobody else's database is interrupted.
import { spawnSync, type ChildProcess } from "node:child_process";
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawnAppServer } from "../../scripts/app-server";
import { demo } from "../support/http";
import { freePort, privatePostgres, type PrivatePostgres } from "./support/private-postgres";

const root = path.resolve(__dirname, "../..");
const BURST = 240;
const CONCURRENCY = 16;
const REQUEST_TIMEOUT_MS = 20_000;

let cluster: PrivatePostgres;
let server: ChildProcess;
let appUrl: string;
let databaseUrl: string;
let serverLog = "";
let cookie: string;
let patientId: string;

const fine = { newConfusion: false, breathless: false, feelsVeryUnwell: false, shivering: false, catheterOut: false, draining: "yes", pain: "none", blood: "none" };

async function waitFor(url: string, seconds: number) {
  for (let i = 0; i < seconds * 4; i++) {
    try {
      if ((await fetch(url)).status < 500) return;
    } catch {
      /* starting */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer within ${seconds} s\n${serverLog.slice(-3000)}`);
}

beforeAll(async () => {
  cluster = await privatePostgres();
  databaseUrl = cluster.url("caddis_fault");
  const admin = new pg.Client({ connectionString: cluster.url("postgres") });
  await admin.connect();
  await admin.query("create database caddis_fault");
  await admin.end();
  const env: NodeJS.ProcessEnv = { ...process.env, DATABASE_URL: databaseUrl };
  for (const script of ["db/migrate.ts", "db/seed.ts"]) {
    const r = spawnSync(path.join(root, "node_modules/.bin/tsx"), [script], { cwd: root, env: { ...env, NODE_ENV: "test" }, encoding: "utf8" });
    if (r.status !== 0) throw new Error(`${script} failed: ${r.stderr}`);
  }
  const port = await freePort();
  // Mail goes nowhere (a port nobody listens on): the seeded outbox stays queued instead of
  // reaching the shared fake inbox other tests read; the background worker still runs.
  env.SMTP_URL = `smtp://127.0.0.1:${await freePort()}`;
  appUrl = `http://localhost:${port}`;
  server = spawnAppServer({
    port,
    env: { ...env, NODE_ENV: "production", APP_URL: appUrl, BETTER_AUTH_SECRET: process.env.E2E_APP_SECRET ?? "fault-secret-0123456789abcdefghijklmnopqrstuvwxyz", DATABASE_POOL_MAX: "10" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  server.stdout!.on("data", (d) => (serverLog += d));
  server.stderr!.on("data", (d) => (serverLog += d));
  await waitFor(`${appUrl}/en/sign-in`, 90);
  const res = await fetch(`${appUrl}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: appUrl },
    body: JSON.stringify(demo.patient),
  });
  expect(res.status).toBe(200);
  cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  const c = new pg.Client({ connectionString: databaseUrl });
  await c.connect();
  patientId = (await c.query<{ id: string }>("select id from patients where health_record_number = 'EM-100-001'")).rows[0].id;
  await c.end();
}, 240_000);

afterAll(async () => {
  // The server's own account of the restart, for whoever reads a failure (git-ignored).
  fs.mkdirSync(path.join(root, "test-results"), { recursive: true });
  fs.writeFileSync(path.join(root, "test-results/postgres-restart-server.log"), serverLog);
  server?.kill("SIGTERM");
  await cluster?.destroy();
});

type Outcome = { key: string; status: number | "hung" | "network"; body: string; ms: number };

async function checkIn(key: string): Promise<Outcome> {
  const t = Date.now();
  try {
    const res = await fetch(`${appUrl}/api/check-ins`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: appUrl, cookie },
      body: JSON.stringify({ patientId, answers: fine, idempotencyKey: key }),
      signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
    });
    return { key, status: res.status, body: await res.text(), ms: Date.now() - t };
  } catch (e) {
    const hung = e instanceof Error && (e.name === "TimeoutError" || e.name === "AbortError");
    return { key, status: hung ? "hung" : "network", body: String(e), ms: Date.now() - t };
  }
}

async function rowsByKey(keys: string[]) {
  const c = new pg.Client({ connectionString: databaseUrl });
  await c.connect();
  try {
    const r = await c.query<{ key: string; n: number }>(
      "select idempotency_key::text as key, count(*)::int as n from check_ins where idempotency_key::text = any($1::text[]) group by 1",
      [keys],
    );
    return new Map(r.rows.map((x) => [x.key, x.n]));
  } finally {
    await c.end();
  }
}

describe("PostgreSQL restarted during a burst of check-ins", () => {
  it("keeps every 2xx, answers the rest with a clear 503, and recovers without a restart", { timeout: 300_000 }, async () => {
    const keys = Array.from({ length: BURST }, () => randomUUID());
    const outcomes: Outcome[] = [];
    let next = 0;
    let restarted: Promise<void> | null = null;
    const worker = async () => {
      while (next < keys.length) {
        const i = next++;
        // A quarter of the way in, the database goes away for two seconds.
        if (i === Math.floor(BURST / 4) && !restarted) {
          restarted = (async () => {
            await cluster.stop();
            await new Promise((r) => setTimeout(r, 2_000));
            await cluster.start();
          })();
        }
        outcomes.push(await checkIn(keys[i]));
      }
    };
    await Promise.all(Array.from({ length: CONCURRENCY }, worker));
    await restarted;

    const byStatus = new Map<string, number>();
    for (const o of outcomes) byStatus.set(String(o.status), (byStatus.get(String(o.status)) ?? 0) + 1);
    const summary = JSON.stringify(Object.fromEntries(byStatus));
    console.log(`[fault] ${BURST} check-ins during a restart: ${summary}; slowest ${Math.max(...outcomes.map((o) => o.ms))} ms`);

    expect(outcomes.filter((o) => o.status === "hung"), `no request hangs past ${REQUEST_TIMEOUT_MS} ms`).toEqual([]);
    expect(outcomes.filter((o) => o.status === "network"), `the server never drops a connection\n${serverLog.slice(-2000)}`).toEqual([]);
    const ok = outcomes.filter((o) => o.status === 200 || o.status === 201);
    const failed = outcomes.filter((o) => !(o.status === 200 || o.status === 201));
    // The restart really happened in the middle of the burst.
    expect(failed.length, summary).toBeGreaterThan(0);
    expect(ok.length, summary).toBeGreaterThan(0);
    for (const f of failed) {
      expect(f.status, `${f.key}: ${f.body}`).toBe(503);
      const json = JSON.parse(f.body) as { error: { code: string; message: string } };
      expect(json.error.code).toBe("unavailable");
      expect(json.error.message.length).toBeGreaterThan(0);
    }

    // Nothing answered 2xx is lost, and nothing refused was half-written.
    await new Promise((r) => setTimeout(r, 500));
    const rows = await rowsByKey(keys);
    expect(ok.filter((o) => rows.get(o.key) !== 1).map((o) => o.key), "2xx check-ins missing from the database").toEqual([]);

    // The same server recovers: within a few seconds new check-ins succeed again, every time.
    let firstOk = -1;
    for (let i = 0; i < 40 && firstOk < 0; i++) {
      const o = await checkIn(randomUUID());
      if (o.status === 201) firstOk = i;
      else await new Promise((r) => setTimeout(r, 250));
    }
    expect(firstOk, "a check-in succeeds again after the restart").toBeGreaterThanOrEqual(0);
    const after = await Promise.all(Array.from({ length: 20 }, () => checkIn(randomUUID())));
    expect(after.map((o) => o.status)).toEqual(Array(20).fill(201));
    expect(server.exitCode, "the server was not restarted").toBeNull();
    // A dropped connection is handled, not left to crash a process that is less forgiving than next start.
    expect(serverLog.match(/uncaughtException.*|unhandledRejection.*/g) ?? [], "uncaught errors in the server").toEqual([]);

    // The phone resends what failed, with the same keys: one row each, nothing doubled.
    const resent = await Promise.all(failed.map((f) => checkIn(f.key)));
    expect(resent.filter((o) => o.status !== 201 && o.status !== 200).map((o) => `${o.status} ${o.body}`)).toEqual([]);
    const final = await rowsByKey(keys);
    expect(keys.filter((k) => final.get(k) !== 1), "each key exactly one check-in").toEqual([]);
  });
});
