// A PostgreSQL cluster of the test's own (initdb into a temp folder, a free port), so a fault
// test can stop and start it without touching anyone else's databases. Binaries are found as
// scripts/services.ts finds them; as root, the server runs as the postgres user.
import { execFile, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { findPgBin } from "../../../scripts/services";

const run = promisify(execFile);
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
const asPg = (cmd: string, args: string[]) => (isRoot ? { cmd: "runuser", args: ["-u", "postgres", "--", cmd, ...args] } : { cmd, args });

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

export type PrivatePostgres = {
  url: (database: string) => string;
  stop: () => Promise<void>;
  start: () => Promise<void>;
  destroy: () => Promise<void>;
};

export async function privatePostgres(): Promise<PrivatePostgres> {
  const bin = findPgBin();
  if (!bin) throw new Error("PostgreSQL server binaries not found (apt-get install -y postgresql)");
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-fault-pg-"));
  const data = path.join(dir, "data");
  const sock = path.join(dir, "run");
  fs.mkdirSync(data);
  fs.mkdirSync(sock);
  if (isRoot) spawnSync("chown", ["-R", "postgres:postgres", dir]);
  fs.chmodSync(data, 0o700);
  const port = await freePort();
  const init = asPg(path.join(bin, "initdb"), ["-D", data, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8"]);
  await run(init.cmd, init.args);
  const opts = `-p ${port} -k ${sock} -c listen_addresses=127.0.0.1 -c max_connections=100 -c fsync=off`;
  const ctl = (args: string[]) => {
    const c = asPg(path.join(bin, "pg_ctl"), ["-D", data, ...args]);
    return run(c.cmd, c.args);
  };
  const start = async () => {
    await ctl(["-l", path.join(dir, "postgres.log"), "-o", opts, "-w", "-t", "60", "start"]);
  };
  await start();
  return {
    url: (database) => `postgres://postgres@127.0.0.1:${port}/${database}`,
    // "fast": connections are cut with 57P01, as in a real restart or fail-over.
    stop: async () => {
      await ctl(["-m", "fast", "-w", "-t", "60", "stop"]);
    },
    start,
    destroy: async () => {
      await ctl(["-m", "immediate", "-w", "stop"]).catch(() => {});
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
