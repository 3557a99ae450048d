import "server-only";
// Fixed-window counters in PostgreSQL (table attempt_counters) for Caddis's own endpoints that
// take a guessable secret: activation codes, carer-invitation sign-ins and the passport device
// card. better-auth's own rate_limit table covers only its endpoints, and calls through
// auth.api.* are not limited (better-auth 1.7 documentation, rate limit). Keys are per client address (hashed),
// so nobody can lock a patient out of their account by guessing from elsewhere (ASVS 6.1.1, 2.4.1).
import { sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { countAttemptQuery } from "@/db/queries/attempt-counters";
import { clientIp, hashIp, limiterAddress } from "@/lib/http/client-ip";
import { AppError } from "@/lib/http/errors";

export type LimitRule = { name: string; max: number; windowSeconds: number };

export const LIMITS = {
  activate: { name: "activate", max: 10, windowSeconds: 15 * 60 },
  carerInvite: { name: "carer-invite", max: 10, windowSeconds: 15 * 60 },
  // A clinician at the door scans once or twice; 30 a minute leaves room for a shared NAT
  // (a care home, a hospital) while making token guessing pointless (256-bit tokens anyway).
  passportCard: { name: "card", max: 30, windowSeconds: 60 },
  // Speech made anew (lib/speech): a long page is some 60 sentences; cached speech is not counted.
  speech: { name: "speech", max: 240, windowSeconds: 60 },
} as const satisfies Record<string, LimitRule>;

/** Counts one attempt; returns how many were made in the current window. */
export async function countAttempt({ key, windowSeconds }: { key: string; windowSeconds: number }, tx: Executor = db) {
  const result = await tx.execute<{ count: number; window_started_at: Date | string }>(countAttemptQuery({ key, windowSeconds }));
  const row = result.rows[0];
  return { count: Number(row.count), windowStartedAt: new Date(row.window_started_at) };
}

/** How many attempts the current window of `key` holds, without counting one. */
export async function currentCount({ key, windowSeconds }: { key: string; windowSeconds: number }, tx: Executor = db) {
  const result = await tx.execute<{ count: number }>(sql`
    select count from attempt_counters
    where key = ${key} and window_started_at > now() - make_interval(secs => ${windowSeconds})`);
  return Number(result.rows[0]?.count ?? 0);
}

export type LimitResult = { allowed: boolean; count: number; retryAfterSeconds: number };

/** Counts an attempt from this request's address and says whether it is within the rule. */
/** The counter's key for this request's address under a rule (the address only as a keyed hash). */
export function limitKey(request: Request | { headers: Headers }, rule: LimitRule): string {
  return `${rule.name}:${hashIp(limiterAddress(clientIp(request.headers)))}`;
}

export async function checkAddress(request: Request | { headers: Headers }, rule: LimitRule): Promise<LimitResult> {
  const key = limitKey(request, rule);
  const { count, windowStartedAt } = await countAttempt({ key, windowSeconds: rule.windowSeconds });
  const retryAfterSeconds = Math.max(1, Math.ceil((windowStartedAt.getTime() + rule.windowSeconds * 1000 - Date.now()) / 1000));
  return { allowed: count <= rule.max, count, retryAfterSeconds };
}

/** As checkAddress, for route handlers: over the limit → 429 with Retry-After. */
export async function limitByAddress(request: Request | { headers: Headers }, rule: LimitRule) {
  const { allowed, retryAfterSeconds } = await checkAddress(request, rule);
  if (!allowed) throw new AppError("rate_limited", undefined, { headers: { "Retry-After": String(retryAfterSeconds) } });
}
