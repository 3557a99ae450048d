import "server-only";
// The Web Push (VAPID) key pair: from the environment in production, else the pair that
// `npm start` / `npm test` made in .data/vapid.json (scripts/services.ts, never committed).
import fs from "node:fs";
import path from "node:path";
import { env } from "./env";

export type VapidKeys = { publicKey: string; privateKey: string; subject: string };

let cached: VapidKeys | null | undefined;

/** Null when no pair is configured: push is then unavailable and the portal says so. */
export function getVapidKeys(): VapidKeys | null {
  if (cached !== undefined) return cached;
  if (env.VAPID_PUBLIC_KEY && env.VAPID_PRIVATE_KEY) {
    cached = { publicKey: env.VAPID_PUBLIC_KEY, privateKey: env.VAPID_PRIVATE_KEY, subject: env.VAPID_SUBJECT };
    return cached;
  }
  try {
    const file = path.resolve(env.CADDIS_DATA_DIR, "vapid.json");
    const pair = JSON.parse(fs.readFileSync(file, "utf8")) as { publicKey?: string; privateKey?: string };
    cached = pair.publicKey && pair.privateKey ? { publicKey: pair.publicKey, privateKey: pair.privateKey, subject: env.VAPID_SUBJECT } : null;
  } catch {
    cached = null;
  }
  return cached;
}
