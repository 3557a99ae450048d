/**
 * Debian packages the app and its tests need: espeak-ng (the portal's Listen control speaks with
 * it where the browser has no voice; lib/speech), chromium (driven by playwright-core; no
 * browser is ever downloaded), poppler-utils (pdftoppm renders PDF pages to images) and openssl
 * (the https test makes a throwaway certificate for its local TLS terminator).
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";

const wanted: { bin: string; pkg: string }[] = [
  { bin: "/usr/bin/espeak-ng", pkg: "espeak-ng" },
  { bin: "/usr/bin/chromium", pkg: "chromium" },
  { bin: "/usr/bin/pdftoppm", pkg: "poppler-utils" },
  { bin: "/usr/bin/openssl", pkg: "openssl" },
];

/** Installs the missing ones (all, or only the packages named: `npm start` needs espeak-ng alone). */
export function ensureTools(only?: string[]) {
  const missing = wanted.filter((w) => (!only || only.includes(w.pkg)) && !fs.existsSync(w.bin)).map((w) => w.pkg);
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
