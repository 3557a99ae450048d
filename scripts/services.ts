/**
 * Local services on loopback: PostgreSQL from Debian's packages, a fake SMTP server with a web
 * inbox (maildev) and a fake S3 store (s3rver). Every step is idempotent: a service already up is
 * left alone. Data lives under .data/ (git-ignored).
 *
 *   tsx scripts/services.ts up | down | status
 */
import { execFileSync, spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";
import pg from "pg";
import { ensureTools } from "./ensure-tools";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const dataDir = path.resolve(root, process.env.CADDIS_DATA_DIR ?? ".data");
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

export const defaults = {
  databaseUrl: process.env.DATABASE_URL ?? "postgres://postgres@127.0.0.1:5433/caddis",
  smtpUrl: process.env.SMTP_URL ?? "smtp://127.0.0.1:1025",
  inboxUrl: process.env.MAIL_INBOX_URL ?? "http://127.0.0.1:1080",
  s3Endpoint: process.env.S3_ENDPOINT ?? "http://127.0.0.1:4569",
  s3Bucket: process.env.S3_BUCKET ?? "caddis-uploads",
  smsApiUrl: process.env.SMS_API_URL ?? "http://127.0.0.1:4590",
};

function log(msg: string) {
  process.stdout.write(`[services] ${msg}\n`);
}

function isLoopback(host: string) {
  return host === "127.0.0.1" || host === "localhost" || host === "::1" || host === "[::1]";
}

export function portOpen(port: number, host = "127.0.0.1", timeoutMs = 500): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host });
    const done = (ok: boolean) => {
      socket.destroy();
      resolve(ok);
    };
    socket.setTimeout(timeoutMs, () => done(false));
    socket.once("connect", () => done(true));
    socket.once("error", () => done(false));
  });
}

async function waitForPort(port: number, what: string, seconds = 30) {
  for (let i = 0; i < seconds * 10; i++) {
    if (await portOpen(port)) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${what} did not open port ${port} within ${seconds} s`);
}

// ---------------------------------------------------------------- PostgreSQL

export function findPgBin(): string | null {
  // Debian keeps the server and its client tools together here; prefer it to whatever is on PATH.
  const base = "/usr/lib/postgresql";
  if (fs.existsSync(base)) {
    const versions = fs
      .readdirSync(base)
      .filter((v) => fs.existsSync(path.join(base, v, "bin", "pg_ctl")))
      .sort((a, b) => Number(b) - Number(a));
    if (versions.length) return path.join(base, versions[0], "bin");
  }
  const fromPath = spawnSync("sh", ["-c", "command -v pg_ctl"], { encoding: "utf8" });
  if (fromPath.status === 0 && fromPath.stdout.trim()) {
    const dir = path.dirname(fs.realpathSync(fromPath.stdout.trim()));
    if (fs.existsSync(path.join(dir, "initdb"))) return dir;
  }
  return null;
}

function installPostgres() {
  if (!isRoot) {
    throw new Error(
      "PostgreSQL server binaries were not found and this user cannot install them.\n" +
        "Install them with `sudo apt-get install -y postgresql` (Debian), or set DATABASE_URL to a running server.",
    );
  }
  log("PostgreSQL not found: installing it from Debian's packages (apt-get install -y postgresql)…");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  let r = spawnSync("apt-get", ["install", "-y", "-q", "postgresql"], { stdio: "inherit", env });
  if (r.status !== 0) {
    spawnSync("apt-get", ["update", "-q"], { stdio: "inherit", env });
    r = spawnSync("apt-get", ["install", "-y", "-q", "postgresql"], { stdio: "inherit", env });
  }
  if (r.status !== 0) {
    throw new Error("apt-get could not install postgresql. Install it by hand or set DATABASE_URL.");
  }
}

/** Commands run as the `postgres` system user when we are root (initdb refuses root). */
function asPgUser(cmd: string, args: string[]) {
  return isRoot ? { cmd: "runuser", args: ["-u", "postgres", "--", cmd, ...args] } : { cmd, args };
}

function ensurePgUser() {
  if (!isRoot) return;
  if (spawnSync("id", ["-u", "postgres"]).status === 0) return;
  execFileSync("useradd", ["--system", "--no-create-home", "--shell", "/usr/sbin/nologin", "postgres"]);
}

// The postgres user must be able to walk down to .data/ (a clone may sit inside a 0700 temp dir).
function ensureTraversable(dir: string) {
  if (!isRoot) return;
  let current = path.dirname(dir);
  while (current !== path.dirname(current)) {
    const mode = fs.statSync(current).mode;
    if ((mode & 0o001) === 0) {
      fs.chmodSync(current, mode | 0o001);
      log(`gave others traverse permission (o+x) on ${current} so PostgreSQL can reach .data/`);
    }
    current = path.dirname(current);
  }
}

export async function postgresUp(databaseUrl = defaults.databaseUrl): Promise<void> {
  const url = new URL(databaseUrl);
  const port = Number(url.port || 5432);
  if (!isLoopback(url.hostname)) {
    log(`DATABASE_URL points at ${url.hostname}: not starting a local PostgreSQL`);
    return;
  }
  let bin = findPgBin();
  if (!bin) {
    installPostgres();
    bin = findPgBin();
    if (!bin) throw new Error("PostgreSQL was installed but pg_ctl was not found");
  }
  const pgDir = path.join(dataDir, "pg");
  const runDir = path.join(dataDir, "pg-run");
  fs.mkdirSync(dataDir, { recursive: true });
  ensurePgUser();
  ensureTraversable(pgDir);
  for (const d of [pgDir, runDir]) {
    fs.mkdirSync(d, { recursive: true });
    if (isRoot) execFileSync("chown", ["postgres:postgres", d]);
    fs.chmodSync(d, 0o700);
  }
  if (!fs.existsSync(path.join(pgDir, "PG_VERSION"))) {
    log(`creating a PostgreSQL cluster in ${path.relative(root, pgDir)}`);
    const c = asPgUser(path.join(bin, "initdb"), [
      "-D", pgDir, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8",
    ]);
    execFileSync(c.cmd, c.args, { stdio: ["ignore", "ignore", "inherit"] });
  }
  const status = asPgUser(path.join(bin, "pg_ctl"), ["-D", pgDir, "status"]);
  const running = spawnSync(status.cmd, status.args, { stdio: "ignore" }).status === 0;
  if (!running) {
    if (await portOpen(port)) {
      log(`port ${port} is already in use by another server; using it as DATABASE_URL says`);
    } else {
      log(`starting PostgreSQL on 127.0.0.1:${port}`);
      const opts = `-p ${port} -k ${runDir} -c listen_addresses=127.0.0.1 -c max_connections=200 -c fsync=on`;
      const start = asPgUser(path.join(bin, "pg_ctl"), [
        "-D", pgDir, "-l", path.join(runDir, "postgres.log"), "-o", opts, "-w", "-t", "60", "start",
      ]);
      const r = spawnSync(start.cmd, start.args, { stdio: ["ignore", "ignore", "inherit"] });
      if (r.status !== 0) {
        throw new Error(`PostgreSQL did not start; see ${path.join(runDir, "postgres.log")}`);
      }
    }
  }
  await waitForDatabase(databaseUrl);
  await ensureDatabase(databaseUrl);
}

async function waitForDatabase(databaseUrl: string) {
  const admin = new URL(databaseUrl);
  admin.pathname = "/postgres";
  for (let i = 0; i < 120; i++) {
    const client = new pg.Client({ connectionString: admin.toString() });
    try {
      await client.connect();
      await client.query("select 1");
      await client.end();
      return;
    } catch {
      await client.end().catch(() => {});
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  throw new Error("PostgreSQL is not accepting connections after 30 s");
}

/** Creates the database named in the URL if it does not exist. */
export async function ensureDatabase(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.replace(/^\//, ""));
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`unexpected database name: ${name}`);
  url.pathname = "/postgres";
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    const found = await client.query("select 1 from pg_database where datname = $1", [name]);
    if (found.rowCount === 0) {
      await client.query(`create database ${name}`);
      log(`created database ${name}`);
    }
  } finally {
    await client.end();
  }
}

export async function dropDatabase(databaseUrl: string) {
  const url = new URL(databaseUrl);
  const name = decodeURIComponent(url.pathname.replace(/^\//, ""));
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`unexpected database name: ${name}`);
  url.pathname = "/postgres";
  const client = new pg.Client({ connectionString: url.toString() });
  await client.connect();
  try {
    await client.query(`drop database if exists ${name} with (force)`);
  } finally {
    await client.end();
  }
}

function postgresDown() {
  const bin = findPgBin();
  const pgDir = path.join(dataDir, "pg");
  if (!bin || !fs.existsSync(path.join(pgDir, "PG_VERSION"))) return;
  const c = asPgUser(path.join(bin, "pg_ctl"), ["-D", pgDir, "-m", "fast", "-w", "stop"]);
  const r = spawnSync(c.cmd, c.args, { stdio: "ignore" });
  log(r.status === 0 ? "PostgreSQL stopped" : "PostgreSQL was not running");
}

// ---------------------------------------------------------------- node-based fakes

type Fake = { name: string; port: number; script: string; args: string[]; nodeArgs?: string[] };

function fakes(): Fake[] {
  const smtp = new URL(defaults.smtpUrl);
  const inbox = new URL(defaults.inboxUrl);
  const s3 = new URL(defaults.s3Endpoint);
  const list: Fake[] = [];
  if (isLoopback(smtp.hostname)) {
    list.push({
      name: "maildev",
      port: Number(smtp.port || 25),
      script: path.join(root, "node_modules/maildev/dist/bin/maildev.js"),
      args: [
        "--smtp", smtp.port || "25", "--web", inbox.port || "1080",
        "--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "--silent",
      ],
    });
  }
  if (isLoopback(s3.hostname)) {
    const s3Dir = path.join(dataDir, "s3");
    fs.mkdirSync(s3Dir, { recursive: true });
    list.push({
      name: "s3rver",
      port: Number(s3.port || 80),
      script: path.join(root, "node_modules/s3rver/bin/s3rver.js"),
      args: [
        "-d", s3Dir, "-a", "127.0.0.1", "-p", s3.port || "80",
        "--configure-bucket", defaults.s3Bucket, path.join(root, "scripts/s3-cors.xml"),
      ],
    });
  }
  const sms = new URL(defaults.smsApiUrl);
  if (isLoopback(sms.hostname)) {
    // The fake SMS service (scripts/fake-sms.ts): texts listed at its web page, JSON at /api/messages.
    list.push({
      name: "fake-sms",
      port: Number(sms.port || 80),
      script: path.join(root, "scripts/fake-sms.ts"),
      args: ["--port", sms.port || "80"],
      nodeArgs: ["--import", "tsx"],
    });
  }
  return list;
}

/** The Web Push (VAPID) key pair, made once and kept in .data/vapid.json (read by lib/config/push.ts). */
export async function ensureVapidKeys() {
  const file = path.join(dataDir, "vapid.json");
  if (fs.existsSync(file)) return;
  const { default: webpush } = await import("web-push");
  fs.mkdirSync(dataDir, { recursive: true });
  fs.writeFileSync(file, JSON.stringify(webpush.generateVAPIDKeys()), { mode: 0o600 });
  log("made the Web Push key pair in .data/vapid.json");
}

async function fakeUp(f: Fake) {
  if (await portOpen(f.port)) return;
  fs.mkdirSync(dataDir, { recursive: true });
  const out = fs.openSync(path.join(dataDir, `${f.name}.log`), "a");
  const child = spawn(process.execPath, [...(f.nodeArgs ?? []), f.script, ...f.args], {
    cwd: root,
    detached: true,
    stdio: ["ignore", out, out],
  });
  child.unref();
  fs.writeFileSync(path.join(dataDir, `${f.name}.pid`), String(child.pid));
  log(`starting ${f.name} on 127.0.0.1:${f.port}`);
  await waitForPort(f.port, f.name);
}

function fakeDown(f: Fake) {
  const pidFile = path.join(dataDir, `${f.name}.pid`);
  if (!fs.existsSync(pidFile)) return;
  const pid = Number(fs.readFileSync(pidFile, "utf8"));
  try {
    process.kill(pid, "SIGTERM");
    log(`${f.name} stopped`);
  } catch {
    /* already gone */
  }
  fs.rmSync(pidFile, { force: true });
}

export async function servicesUp() {
  // The portal's Listen control speaks with espeak-ng where the browser has no voice (lib/speech).
  ensureTools(["espeak-ng"]);
  await postgresUp();
  for (const f of fakes()) await fakeUp(f);
  await ensureVapidKeys();
}

export function servicesDown() {
  for (const f of fakes()) fakeDown(f);
  postgresDown();
}

async function status() {
  const db = new URL(defaults.databaseUrl);
  const rows = [{ name: "postgres", port: Number(db.port || 5432) }, ...fakes()];
  for (const r of rows) log(`${r.name.padEnd(9)} :${r.port} ${(await portOpen(r.port)) ? "up" : "down"}`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const cmd = process.argv[2] ?? "up";
  const run = cmd === "up" ? servicesUp : cmd === "down" ? async () => servicesDown() : status;
  run().catch((e: Error) => {
    console.error(`[services] ${e.message}`);
    process.exit(1);
  });
}
