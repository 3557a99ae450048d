/**
 * Debian packages the browser and PDF tests need: chromium (driven by playwright-core; no
 * browser is ever downloaded), poppler-utils (pdftoppm renders PDF pages to images) and openssl
 * (the https test makes a throwaway certificate for its local TLS terminator).
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";

const wanted: { bin: string; pkg: string }[] = [
  { bin: "/usr/bin/chromium", pkg: "chromium" },
  { bin: "/usr/bin/pdftoppm", pkg: "poppler-utils" },
  { bin: "/usr/bin/openssl", pkg: "openssl" },
];

export function ensureTools() {
  const missing = wanted.filter((w) => !fs.existsSync(w.bin)).map((w) => w.pkg);
  if (missing.length === 0) return;
  const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
  if (!isRoot) {
    throw new Error(`Missing Debian packages: ${missing.join(" ")}. Install them with sudo apt-get install -y ${missing.join(" ")}.`);
  }
  console.log(`[tools] installing ${missing.join(" ")} from Debian's packages…`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  let r = spawnSync("apt-get", ["install", "-y", "-q", ...missing], { stdio: "inherit", env });
  if (r.status !== 0) {
    spawnSync("apt-get", ["update", "-q"], { stdio: "inherit", env });
    r = spawnSync("apt-get", ["install", "-y", "-q", ...missing], { stdio: "inherit", env });
  }
  if (r.status !== 0) throw new Error(`apt-get could not install ${missing.join(" ")}`);
}

if (process.argv[1]?.endsWith("ensure-tools.ts")) ensureTools();
