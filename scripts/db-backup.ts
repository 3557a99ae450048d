/**
 * `npm run db:backup [-- FILE]`: a consistent pg_dump (custom format) of DATABASE_URL, by default
 * to .data/backups/caddis-<time>.dump. `npm run db:restore [-- FILE]` puts one back (the latest
 * when no file is named), replacing what the database holds.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { defaults, findPgBin } from "./services";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
export const backupDir = path.resolve(root, process.env.CADDIS_DATA_DIR ?? ".data", "backups");

function tool(name: string) {
  const bin = findPgBin();
  if (!bin) throw new Error("PostgreSQL client tools not found (npm start installs them)");
  return path.join(bin, name);
}

export function backup(databaseUrl = defaults.databaseUrl, file?: string): string {
  fs.mkdirSync(backupDir, { recursive: true });
  const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\..*/, "");
  const out = file ?? path.join(backupDir, `caddis-${stamp}.dump`);
  const r = spawnSync(tool("pg_dump"), ["--format=custom", "--no-owner", "--file", out, databaseUrl], { stdio: "inherit" });
  if (r.status !== 0) throw new Error("pg_dump failed");
  return out;
}

export function latestBackup(): string | null {
  if (!fs.existsSync(backupDir)) return null;
  const files = fs.readdirSync(backupDir).filter((f) => f.endsWith(".dump")).sort();
  return files.length ? path.join(backupDir, files[files.length - 1]) : null;
}

export function restore(file: string, databaseUrl = defaults.databaseUrl) {
  if (!fs.existsSync(file)) throw new Error(`no such backup: ${file}`);
  const r = spawnSync(
    tool("pg_restore"),
    ["--clean", "--if-exists", "--no-owner", "--single-transaction", "--exit-on-error", "--dbname", databaseUrl, file],
    { stdio: "inherit" },
  );
  if (r.status !== 0) throw new Error("pg_restore failed");
}

const self = process.argv[1] ? path.resolve(process.argv[1]) : "";
if (self === fileURLToPath(import.meta.url)) {
  const [cmd, file] = process.argv.slice(2);
  try {
    if (cmd === "restore") {
      const f = file ?? latestBackup();
      if (!f) throw new Error("no backup found in .data/backups");
      restore(f);
      console.log(`[db] restored ${path.relative(root, f)}`);
    } else {
      console.log(`[db] backup written to ${path.relative(root, backup(defaults.databaseUrl, file))}`);
    }
  } catch (e) {
    console.error(`[db] ${e instanceof Error ? e.message : e}`);
    process.exit(1);
  }
}
