/**
 * `npm run bench`: builds the production app, loads a large invented data set into its own
 * database, and prints one table of figures (also written to docs/performance.md).
 * A script, not a test: figures are reported, never asserted, so nothing flakes.
 */
import { spawnSync, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { gzipSync } from "node:zlib";
import autocannon from "autocannon";
import pg from "pg";
import { spawnAppServer } from "../app-server";
import { ensureTools } from "../ensure-tools";
import { defaults, dropDatabase, ensureDatabase, portOpen, servicesUp } from "../services";
import { signInOverHttp } from "../../tests/support/sign-in-over-http";
import { seedLarge } from "./large-data";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
const bin = (n: string) => path.join(root, "node_modules/.bin", n);
const port = Number(process.env.BENCH_PORT ?? 3016);
const base = `http://localhost:${port}`;
const seconds = Number(process.env.BENCH_SECONDS ?? 20);
const connections = Number(process.env.BENCH_CONNECTIONS ?? 50);
// The data set at two sizes, to show how the figures move with ten times the data.
const SMALL = Number(process.env.BENCH_PATIENTS_SMALL ?? 10_000);
const LARGE = Number(process.env.BENCH_PATIENTS_LARGE ?? 100_000);
let caseloadPlans: { label: string; plan: string }[] = [];
// BENCH_ONLY=card: only the card against /en/p and /icon.svg (and what the card sends), at the
// small data set; no large data set, caseload, PDFs or Lighthouse, and docs/performance.md is
// left alone (the figures are printed). For working on the card; the default run is unchanged.
const only = process.env.BENCH_ONLY === "card" ? "card" : null;
// Its own database, so two benches (or a bench and a helper's) do not drop each other's.
const benchDatabase = process.env.BENCH_DATABASE ?? "caddis_bench";

// BENCH_SKIP_BUILD=1 reuses the .next build already in the worktree (built from the same tree).
const skipBuild = process.env.BENCH_SKIP_BUILD === "1" && fs.existsSync(path.join(root, ".next/BUILD_ID"));
const loadAverage = () => os.loadavg().map((v) => v.toFixed(2)).join(", ");

type Row = { what: string; figure: string; target?: string; met?: boolean };
const rows: Row[] = [];
const add = (what: string, figure: string, target?: string, met?: boolean) => {
  rows.push({ what, figure, target, met });
  console.log(`[bench] ${what}: ${figure}${target ? ` (target ${target}: ${met ? "met" : "MISSED"})` : ""}`);
};

/** The p-th percentile by nearest rank (the 99th of 200 values is the 198th, not the largest). */
function pct(values: number[], p: number) {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1))];
}

async function load(url: string, headers: Record<string, string> = {}, varyIp = false) {
  let n = 0;
  const result = await autocannon({
    url,
    connections,
    duration: seconds,
    headers,
    // Each request from its own address, as a crowd of phones would be (per-address limits).
    requests: varyIp
      ? [{ setupRequest: (req: Record<string, unknown>) => ({ ...req, headers: { ...headers, "x-forwarded-for": `10.${(n >> 16) & 255}.${(n >> 8) & 255}.${n++ & 255}` } }) }]
      : undefined,
  });
  return { rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, non2xx: result.non2xx, total: result.requests.total, timeouts: result.timeouts, errors: result.errors };
}

async function timed(times: number, fn: () => Promise<unknown>) {
  const out: number[] = [];
  for (let i = 0; i < times; i++) {
    const t = performance.now();
    await fn();
    out.push(performance.now() - t);
  }
  return out;
}

async function xacts(client: pg.Client, db: string) {
  const r = await client.query("select xact_commit + xact_rollback as n from pg_stat_database where datname = $1", [db]);
  return Number(r.rows[0].n);
}

async function firstLoadJs(pathname: string, cookie?: string) {
  const html = await (await fetch(`${base}${pathname}`, { headers: cookie ? { cookie } : {} })).text();
  const srcs = [...new Set([...html.matchAll(/<script[^>]+src="([^"]+\.js)"/g)].map((m) => m[1]))];
  let total = 0;
  for (const src of srcs) {
    const body = Buffer.from(await (await fetch(new URL(src, base))).arrayBuffer());
    total += gzipSync(body).length;
  }
  return total;
}

/** The card's whole transfer: the document and every file it asks for (there should be none). */
async function cardTransfer(pathname: string) {
  const html = Buffer.from(await (await fetch(`${base}${pathname}`)).arrayBuffer());
  const refs = [...html.toString().matchAll(/<(?:script|link|img)\b[^>]*(?:src|href)="([^"]+)"/g)].map((m) => m[1]!);
  let bytes = html.length;
  let gzip = gzipSync(html).length;
  for (const ref of refs) {
    const body = Buffer.from(await (await fetch(new URL(ref, base))).arrayBuffer());
    bytes += body.length;
    gzip += gzipSync(body).length;
  }
  return { bytes, gzip, subresources: refs.length };
}

type Scores = { performance: number; accessibility: number; bestPractices: number };

/** One Lighthouse run; null when the trace failed (a failed run is never a score). */
async function lighthouseOnce(pathname: string, cookie?: string): Promise<Scores | null> {
  const { default: lighthouse } = await import("lighthouse");
  const chromeLauncher = await import("chrome-launcher");
  const chrome = await chromeLauncher.launch({
    chromePath: "/usr/bin/chromium",
    chromeFlags: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking"],
  });
  try {
    const result = await lighthouse(`${base}${pathname}`, {
      port: chrome.port,
      output: "json",
      logLevel: "error",
      onlyCategories: ["performance", "accessibility", "best-practices"],
      extraHeaders: cookie ? { cookie } : undefined,
      formFactor: "mobile",
    });
    const lhr = result?.lhr;
    const c = lhr?.categories;
    if (!lhr || lhr.runtimeError || c?.performance.score == null || c.accessibility.score == null) {
      console.log(`[bench] Lighthouse ${pathname}: failed run (${lhr?.runtimeError?.code ?? "no score"}), run again`);
      return null;
    }
    return { performance: c.performance.score, accessibility: c.accessibility.score, bestPractices: c["best-practices"].score ?? 0 };
  } finally {
    await chrome.kill();
  }
}

/** A Lighthouse score, a failed trace run again (up to three times); null when all failed. */
async function lighthouseScores(pathname: string, cookie?: string): Promise<Scores | null> {
  for (let attempt = 0; attempt < 3; attempt++) {
    const scores = await lighthouseOnce(pathname, cookie);
    if (scores) return scores;
  }
  return null;
}

/** Signs in; staff give the code from their demo TOTP secret, as every member of staff must. */
function signInCookie(email: string, password: string) {
  return signInOverHttp({ baseUrl: base, email, password, headers: { "x-forwarded-for": "10.250.0.1" } });
}

/** POST /api/patients/[id]/passport (reissue when asked); the token from the answer's card address. */
async function issue(cookie: string, patientId: string, reissue: boolean) {
  const send = () =>
    fetch(`${base}/api/patients/${patientId}/passport`, {
      method: "POST",
      headers: { cookie, origin: base, "content-type": "application/json" },
      body: JSON.stringify(reissue ? { reissue: true } : {}),
    });
  // A pooled connection left idle past the server's keep-alive (while the PDF child ran) can be
  // closed as it is reused: "other side closed" before any answer. Sent again once.
  const res = await send().catch((error: { cause?: { code?: string } }) => {
    if (error.cause?.code !== "UND_ERR_SOCKET") throw error;
    return send();
  });
  if (res.status !== 201) throw new Error(`passport issue failed: ${res.status} ${await res.text()}`);
  const { url } = (await res.json()) as { url: string };
  return decodeURIComponent(new URL(url).pathname.split("/").pop()!);
}

/** Card, prerendered page and public file under the same load; the card's ratios to both. */
async function loadCard(token: string, label: string) {
  const card = await load(`${base}/en/p/${token}`, {}, true);
  add(`device card (${label})`, `${card.rps.toFixed(0)} req/s, p50 ${card.p50} ms, p99 ${card.p99} ms (${card.total} answered, ${card.non2xx} non-2xx, ${card.timeouts} timed out after 10 s)`);
  return card;
}

/** The caseload API: p50/p99 of a filtered page of 50, and SQL transactions per request by page size. */
async function caseload(client: pg.Client, nurse: string, label: string) {
  const caseloadPath = (size: number) => `/api/caseload?page=3&pageSize=${size}&filter=due-soon&sort=next-change`;
  for (let i = 0; i < 5; i++) await fetch(`${base}${caseloadPath(50)}`, { headers: { cookie: nurse } });
  const lat = await timed(200, () => fetch(`${base}${caseloadPath(50)}`, { headers: { cookie: nurse } }).then((r) => r.text()));
  add(`caseload API, page of 50, filtered (${label})`, `p50 ${pct(lat, 50).toFixed(1)} ms, p99 ${pct(lat, 99).toFixed(1)} ms`, "p99 ≤ 100 ms", pct(lat, 99) <= 100);
  // pg_stat_database is fed by each backend when it has been idle for 10 s (PostgreSQL 15+),
  // so wait that long before each reading; the bench's own reading is one transaction.
  const settled = async () => {
    await new Promise((r) => setTimeout(r, 11_000));
    return xacts(client, benchDatabase);
  };
  const perRequest: string[] = [];
  let before = await settled();
  for (const size of [10, 50, 100]) {
    for (let i = 0; i < 20; i++) await fetch(`${base}${caseloadPath(size)}`, { headers: { cookie: nurse } }).then((r) => r.text());
    const after = await settled();
    perRequest.push(`${size}: ${((after - before - 1) / 20).toFixed(1)}`);
    before = after;
  }
  add(`SQL transactions per caseload request (${label}; page size: count; session and audit included)`, perRequest.join(", "));
  return { p50: pct(lat, 50), p99: pct(lat, 99) };
}

/** p50/p99 of other caseload views at the large set: the first page as it opens, the trial filter, other orders and a search. */
async function otherCaseloadViews(nurse: string, label: string) {
  for (const [name, query] of [
    ["first page, no filter", "page=1&pageSize=50"],
    ["trial without catheter filter", "page=1&pageSize=50&filter=twoc"],
    ["sorted by name, page 3", "page=3&pageSize=50&sort=name"],
    ["by days since insertion, longest first", "page=1&pageSize=50&sort=days-inserted&dir=desc"],
    ["search by part of a name", "page=1&pageSize=50&q=patient0421"],
  ] as const) {
    const path = `${base}/api/caseload?${query}`;
    for (let i = 0; i < 5; i++) await fetch(path, { headers: { cookie: nurse } }).then((r) => r.text());
    const lat = await timed(200, () => fetch(path, { headers: { cookie: nurse } }).then((r) => r.text()));
    add(`caseload API, ${name} (${label})`, `p50 ${pct(lat, 50).toFixed(1)} ms, p99 ${pct(lat, 99).toFixed(1)} ms`, "p99 ≤ 100 ms", pct(lat, 99) <= 100);
  }
}

/** The caseload views whose statements docs/performance.md shows: label, view, page. */
const EXPLAINED = [
  ["page 3 of 50, due soon, by next change", { filter: "due-soon", sort: "next-change", dir: "asc", q: "" }, 3],
  ["first page of 50, no filter, by next change: the part with a catheter", { sort: "next-change", dir: "asc", q: "" }, 1],
] as const;

/** EXPLAIN ANALYZE of the caseload's first statement for each EXPLAINED view, as the API sends it for the bench nurse. */
async function explainCaseload(client: pg.Client) {
  const { caseloadParts, caseloadStatement, COUNT_CAP } = await import("../../db/queries/caseload");
  const { PgDialect } = await import("drizzle-orm/pg-core");
  const orgs = await client.query("select organisation_id from memberships m join \"user\" u on u.id = m.user_id where u.email = 'community.nurse@eastmere.example'");
  const plans: { label: string; plan: string }[] = [];
  for (const [label, view, page] of EXPLAINED) {
    const statement = caseloadStatement({
      part: caseloadParts(view)[0],
      organisationIds: orgs.rows.map((r) => r.organisation_id as string),
      view,
      today: new Date().toISOString().slice(0, 10),
      dueSoonDays: 14,
      timeZone: "Europe/London",
      limit: 50,
      offset: (page - 1) * 50,
      countCap: Math.max(COUNT_CAP, page * 50) + 1,
    });
    const query = new PgDialect().sqlToQuery(statement);
    const plan = await client.query(`explain (analyze, buffers) ${query.sql}`, query.params as unknown[]);
    plans.push({ label, plan: plan.rows.map((r) => r["QUERY PLAN"] as string).join("\n") });
  }
  return plans;
}

/** The loader's steps; episodes with their events and the diary entries run side by side. */
const stepTimes = (t: Record<string, number>) =>
  Object.entries(t)
    .map(([k, v]) => `${k} ${v.toFixed(1)} s`)
    .join(", ");

async function main() {
  ensureTools();
  await servicesUp();
  const url = new URL(defaults.databaseUrl);
  url.pathname = `/${benchDatabase}`;
  const databaseUrl = url.toString();
  await dropDatabase(databaseUrl);
  await ensureDatabase(databaseUrl);
  const env = { ...process.env, DATABASE_URL: databaseUrl, APP_URL: base, NEXT_TELEMETRY_DISABLED: "1", BETTER_AUTH_SECRET: randomBytes(32).toString("base64url") };
  for (const s of ["db/migrate.ts", "db/seed.ts"]) {
    if (spawnSync(bin("tsx"), [s], { cwd: root, env, stdio: "ignore" }).status !== 0) throw new Error(`${s} failed`);
  }
  let t0 = Date.now();
  let counts = await seedLarge(databaseUrl, { patients: SMALL });
  add("data set, small", `${counts.patients} patients, ${counts.episodes} episodes, ${counts.events} events, ${counts.diary} diary entries (loaded in ${((Date.now() - t0) / 1000).toFixed(1)} s: ${stepTimes(counts.times)})`);

  // As the app connects (db/index.ts): no JIT, so the EXPLAIN below is what the app runs.
  const client = new pg.Client({ connectionString: databaseUrl, options: "-c jit=off" });
  await client.connect();
  add("load average before the build (1, 5, 15 min)", loadAverage());

  if (!skipBuild && spawnSync(bin("next"), ["build"], { cwd: root, env, stdio: "ignore" }).status !== 0) throw new Error("next build failed");
  if (await portOpen(port)) throw new Error(`port ${port} is busy (BENCH_PORT)`);
  // Through the server entry, as behind a load balancer on loopback: the bench says which client
  // each request plays in X-Forwarded-For.
  // BENCH_SERVER_NODE_OPTIONS (e.g. "--cpu-prof --cpu-prof-dir=/tmp/prof") profiles the server alone.
  const serverNodeOptions = process.env.BENCH_SERVER_NODE_OPTIONS ? { NODE_OPTIONS: process.env.BENCH_SERVER_NODE_OPTIONS } : {};
  const server: ChildProcess = spawnAppServer({ port, env: { ...env, ...serverNodeOptions, NODE_ENV: "production", TRUSTED_PROXIES: "127.0.0.1" }, stdio: "ignore" });
  try {
    for (let i = 0; i < 240 && !(await fetch(`${base}/en/sign-in`).then((r) => r.ok).catch(() => false)); i++) await new Promise((r) => setTimeout(r, 250));

    const nurse = await signInCookie("community.nurse@eastmere.example", "Eastmere-community-2026");
    // A passport issued through the real route (token, booklet, audit), as a nurse would.
    const token = await issue(nurse, (await client.query("select id from patients where health_record_number = 'EM-100-002'")).rows[0].id, false);
    add("load average at the start of the load tests", loadAverage());

    // 1. Device card against a prerendered page of the same build and a public file, under the
    // same load. The typed-code form /en/p is prerendered at build time (the same HTML for
    // everyone, no script, so no CSP nonce) and served from the build's cache: the truly static
    // page. The public file skips the app altogether: the server's ceiling.
    const staticPage = "/en/p";
    const staticFile = "/icon.svg";
    const cardSmall = await loadCard(token, `${counts.patients} patients`);
    const page = await load(`${base}${staticPage}`, {}, true);
    const file = await load(`${base}${staticFile}`);
    add(`prerendered page ${staticPage}`, `${page.rps.toFixed(0)} req/s, p50 ${page.p50} ms, p99 ${page.p99} ms (${page.total} answered, ${page.non2xx} non-2xx, ${page.timeouts} timed out)`);
    add(`public file ${staticFile} (no rendering)`, `${file.rps.toFixed(0)} req/s, p50 ${file.p50} ms, p99 ${file.p99} ms`);
    add("card / prerendered page throughput", (cardSmall.rps / page.rps).toFixed(2), "≥ 0.5", cardSmall.rps / page.rps >= 0.5);
    add("card / public file throughput", (cardSmall.rps / file.rps).toFixed(3), "≥ 0.1", cardSmall.rps / file.rps >= 0.1);

    // 2. What the card sends: JavaScript and everything over the wire (HTML, CSS, fonts, images).
    const cardJs = await firstLoadJs(`/en/p/${token}`);
    add("device card JavaScript (gzip)", `${(cardJs / 1024).toFixed(1)} KiB`, "0 KiB", cardJs === 0);
    for (const locale of ["en", "pl"]) {
      const t = await cardTransfer(`/${locale}/p/${token}`);
      add(`device card transfer, /${locale}`, `${(t.bytes / 1024).toFixed(1)} KB uncompressed (${(t.gzip / 1024).toFixed(1)} KB gzip), ${t.subresources} other files`, "≤ 30 KB", t.bytes <= 30 * 1024);
    }
    if (only === "card") {
      add("load average at the end", loadAverage());
      printReport();
      return;
    }

    // 3. Caseload at the small data set.
    const caseSmall = await caseload(client, nurse, `${counts.patients} patients`);

    // 4. The large data set, loaded into the running app's database, then the card and the
    // caseload again: how each figure moves with ten times the data.
    t0 = Date.now();
    const small = counts;
    counts = await seedLarge(databaseUrl, { patients: LARGE });
    const loadSeconds = (Date.now() - t0) / 1000;
    add("data set, large", `${counts.patients} patients, ${counts.episodes} episodes, ${counts.events} events, ${counts.diary} diary entries (added in ${loadSeconds.toFixed(1)} s: ${stepTimes(counts.times)})`, "≤ 120 s", loadSeconds <= 120);
    const cardLarge = await loadCard(token, `${counts.patients} patients`);
    add("card / prerendered page throughput (large)", (cardLarge.rps / page.rps).toFixed(2), "≥ 0.5", cardLarge.rps / page.rps >= 0.5);
    const caseLarge = await caseload(client, nurse, `${counts.patients} patients`);
    await otherCaseloadViews(nurse, `${counts.patients} patients`);
    add(
      `cost curve, ${small.patients} → ${counts.patients} patients`,
      `card ${cardSmall.rps.toFixed(0)} → ${cardLarge.rps.toFixed(0)} req/s (p99 ${cardSmall.p99} → ${cardLarge.p99} ms); caseload p50 ${caseSmall.p50.toFixed(1)} → ${caseLarge.p50.toFixed(1)} ms, p99 ${caseSmall.p99.toFixed(1)} → ${caseLarge.p99.toFixed(1)} ms`,
    );
    caseloadPlans = await explainCaseload(client);

    // 5. Passport booklet PDF for a patient with 3 and with 30 history entries (two large-set
    // patients, their event history cut or padded to n), alone and as part of an issue.
    const benchPatients = (await client.query("select id from patients where health_record_number like 'BENCH-%' order by health_record_number limit 2")).rows;
    for (const [i, n] of [3, 30].entries()) {
      const id: string = benchPatients[i].id;
      await client.query(
        `delete from episode_events where patient_id = $1 and id not in
           (select id from episode_events where patient_id = $1 order by occurred_at desc limit $2)`,
        [id, n],
      );
      await client.query(
        `insert into episode_events (episode_id, patient_id, kind, notes, occurred_at, recorded_by_name)
         select (select id from catheter_episodes where patient_id = $1 and removed_at is null limit 1), $1, 'visit', 'bench', now() - g * interval '1 day', 'Bench Nurse'
         from generate_series(1, greatest(0, $2 - (select count(*) from episode_events where patient_id = $1))) g`,
        [id, n],
      );
      const history = Number((await client.query("select count(*) from episode_events where patient_id = $1", [id])).rows[0].count);
      // The PDF alone, in its own process (renderPassportPdf on the patient's booklet data).
      const child = spawnSync(process.execPath, [path.join(root, "scripts/bench/pdf-child.mjs"), id, "40"], { cwd: root, env: { ...env, NODE_ENV: "production" }, encoding: "utf8" });
      if (child.status !== 0) throw new Error(`PDF timing failed: ${child.stderr}`);
      const pdf = JSON.parse(child.stdout.trim().split("\n").pop()!) as { times: number[]; bytes: number; history: number };
      add(
        `passport PDF, ${pdf.history} history entries (${(pdf.bytes / 1024).toFixed(0)} KiB)`,
        `p50 ${pct(pdf.times, 50).toFixed(0)} ms, p95 ${pct(pdf.times, 95).toFixed(0)} ms`,
        "p95 ≤ 500 ms",
        pct(pdf.times, 95) <= 500,
      );
      // The whole issue through the route: PDF, object storage, transaction, GP summary queued.
      await issue(nurse, id, false);
      const times = await timed(20, () => issue(nurse, id, true));
      add(`passport issue through the route, ${history} history entries`, `p50 ${pct(times, 50).toFixed(0)} ms, p95 ${pct(times, 95).toFixed(0)} ms`);
    }

    // 6. First-load JavaScript (gzip) of the React pages.
    const patient = await signInCookie("arthur.pell@eastmere.example", "Eastmere-patient-2026");
    add("load average before first-load JS and Lighthouse", loadAverage());
    add("first-load JS, check-in", `${((await firstLoadJs("/en/check-in", patient)) / 1024).toFixed(1)} KiB`);
    add("first-load JS, caseload", `${((await firstLoadJs("/en/caseload", nurse)) / 1024).toFixed(1)} KiB`);

    // 7. Lighthouse mobile, three runs per page (the pages taken in turn, so a slow minute hits
    // them all). A failed trace is run again and never counted as a score. The card must reach
    // its targets in each run; the portal pages by the median.
    const pages = [["device card", `/en/p/${token}`, undefined], ["portal Today", "/en/today", patient], ["check-in", "/en/check-in", patient]] as const;
    const runs = new Map<string, Scores[]>();
    const failed = new Map<string, number>();
    for (let round = 0; round < 3; round++) {
      for (const [name, p, cookie] of pages) {
        const scores = await lighthouseScores(p, cookie);
        if (scores) runs.set(name, [...(runs.get(name) ?? []), scores]);
        else failed.set(name, (failed.get(name) ?? 0) + 1);
      }
    }
    for (const [name] of pages) {
      const all = runs.get(name) ?? [];
      const perf = all.map((r) => Math.round(r.performance * 100));
      const a11y = all.map((r) => Math.round(r.accessibility * 100));
      const note = `performance ${perf.join("/") || "none"}, accessibility ${a11y.join("/") || "none"}${failed.get(name) ? `; ${failed.get(name)} run(s) failed three times` : ""}`;
      if (name === "device card") {
        add(`Lighthouse ${name} (each of 3 runs)`, note, "perf ≥ 95 and a11y 100 in each run", all.length === 3 && perf.every((x) => x >= 95) && a11y.every((x) => x === 100));
      } else {
        const median = [...perf].sort((x, y) => x - y)[Math.floor(perf.length / 2)] ?? 0;
        add(`Lighthouse ${name} (median of ${all.length})`, note, "perf ≥ 95 (median)", all.length > 0 && median >= 95);
      }
    }
    add("load average at the end", loadAverage());
  } finally {
    server.kill("SIGTERM");
    await client.end();
  }
  writeReport();
}

/** The table, printed only (BENCH_ONLY): a partial run never replaces the full run's figures. */
function printReport() {
  console.log(["", "| measure | figure | target | met |", "|---|---|---|---|", ...rows.map((r) => `| ${r.what} | ${r.figure} | ${r.target ?? ""} | ${r.target ? (r.met ? "yes" : "**no**") : ""} |`)].join("\n"));
}

function writeReport() {
  const machine = `${os.cpus().length} × ${os.cpus()[0]?.model ?? "cpu"}, ${(os.totalmem() / 2 ** 30).toFixed(0)} GiB, Node.js ${process.version}`;
  const lines = [
    "# Performance",
    "",
    `Measured by \`npm run bench\` on ${new Date().toISOString().slice(0, 16).replace("T", " ")} UTC, ${machine}; autocannon ${connections} connections × ${seconds} s on loopback; load average now ${loadAverage()}.`,
    "",
    "| measure | figure | target | met |",
    "|---|---|---|---|",
    ...rows.map((r) => `| ${r.what} | ${r.figure} | ${r.target ?? ""} | ${r.target ? (r.met ? "yes" : "**no**") : ""} |`),
    "",
    ...caseloadPlans.flatMap(({ label, plan }) => [`The caseload's statement at the large data set (${label}), \`EXPLAIN (ANALYZE, BUFFERS)\`:`, "", "```", plan, "```", ""]),
  ];
  // Hand-written notes below the marker (why a target was missed) survive a new run.
  const file = path.join(root, "docs/performance.md");
  const marker = "<!-- notes: kept by npm run bench -->";
  const old = fs.existsSync(file) ? fs.readFileSync(file, "utf8") : "";
  const notes = old.includes(marker) ? old.slice(old.indexOf(marker)) : `${marker}\n`;
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, `${lines.join("\n")}\n${notes}`);
  console.log(`\n${lines.join("\n")}`);
}

main().catch((e) => {
  console.error("[bench]", e);
  if (only) printReport();
  else writeReport();
  process.exit(1);
});
