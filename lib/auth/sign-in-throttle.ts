import "server-only";
// Failed sign-ins counted per account, from any address (OWASP Authentication Cheat Sheet,
// "Account Lockout": the counter belongs to the account, not the source address; ASVS 5.0.0
// 6.1.1, 6.3.1). The per-address limit (better-auth's rateLimit) stays in front of it.
//
// Bounds (docs/security.md explains the choice):
//   - the first 5 wrong passwords in a row cost nothing (people mistype);
//   - from the 5th, each one makes the next check wait 1 s, doubling (2, 4, 8 … s) up to 15 min;
//     attempts made while waiting are refused unchecked (429 with Retry-After) and do not grow it;
//   - 24 h without a failure forgets the run; a full sign-in or a password reset ends it;
//   - a browser the account has signed in on before (a signed "known device" cookie, OWASP
//     "Slow Down Online Guessing Attacks with Device Cookies") is not made to wait, unless it has
//     itself failed 10 times in the last hour: a stranger cannot lock the real user out there;
//   - anywhere else the real user waits at most 15 min, or resets the password by e-mail.
// After 10 attempts in 24 h (failed or held back) the owner is told by e-mail, at most once a
// day; every checked failure, every full sign-in and every notice is an audit event.
import { createHmac, randomBytes } from "node:crypto";
import { and, eq, gt, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { signInThrottles, user, type SignInThrottle } from "@/db/schema";
import { sendSignInAttemptsNotice } from "@/lib/admin/mail";
import { env } from "@/lib/config/env";
import { clientIp, hashIp, limiterAddress } from "@/lib/http/client-ip";
import { countAttempt, currentCount } from "@/lib/http/rate-limit";
import { audit } from "@/lib/records/audit";

export const ACCOUNT_LIMITS = {
  freeFailures: 5,
  firstDelaySeconds: 1,
  maxDelaySeconds: 15 * 60,
  forgetAfterHours: 24,
  reportWindowHours: 24,
  noticeAfterAttempts: 10,
  noticeEveryHours: 24,
  knownDeviceMaxFailures: 10,
  knownDeviceWindowSeconds: 60 * 60,
  knownDeviceCookieDays: 180,
  maxAddressesKept: 100,
} as const;

const HOUR = 60 * 60 * 1000;

/** Seconds the next check waits after `failures` wrong answers in a row. */
export function delayAfter(failures: number): number {
  if (failures < ACCOUNT_LIMITS.freeFailures) return 0;
  const seconds = ACCOUNT_LIMITS.firstDelaySeconds * 2 ** (failures - ACCOUNT_LIMITS.freeFailures);
  return Math.min(seconds, ACCOUNT_LIMITS.maxDelaySeconds);
}

export type ThrottleState = Pick<
  SignInThrottle,
  "consecutiveFailures" | "blockedUntil" | "windowStartedAt" | "failedAttempts" | "heldAttempts" | "secondStepFailures" | "addressHashes" | "lastAttemptAt" | "notifiedAt"
>;

export type AttemptKind = "password" | "second_step" | "held";

export function emptyState(now: Date): ThrottleState {
  return {
    consecutiveFailures: 0,
    blockedUntil: null,
    windowStartedAt: now,
    failedAttempts: 0,
    heldAttempts: 0,
    secondStepFailures: 0,
    addressHashes: [],
    lastAttemptAt: now,
    notifiedAt: null,
  };
}

/** The state after one attempt, and whether the owner is now due an e-mail. Pure. */
export function applyAttempt(state: ThrottleState, { kind, addressHash, now }: { kind: AttemptKind; addressHash: string; now: Date }) {
  const quiet = now.getTime() - state.lastAttemptAt.getTime();
  const newWindow = quiet >= ACCOUNT_LIMITS.reportWindowHours * HOUR;
  const base: ThrottleState = newWindow
    ? { ...emptyState(now), notifiedAt: state.notifiedAt, consecutiveFailures: quiet >= ACCOUNT_LIMITS.forgetAfterHours * HOUR ? 0 : state.consecutiveFailures }
    : { ...state };
  const next: ThrottleState = { ...base, lastAttemptAt: now };
  if (kind === "held") next.heldAttempts += 1;
  else {
    next.failedAttempts += 1;
    if (kind === "second_step") next.secondStepFailures += 1;
    next.consecutiveFailures += 1;
    const wait = delayAfter(next.consecutiveFailures);
    next.blockedUntil = wait > 0 ? new Date(now.getTime() + wait * 1000) : null;
  }
  if (!next.addressHashes.includes(addressHash) && next.addressHashes.length < ACCOUNT_LIMITS.maxAddressesKept) {
    next.addressHashes = [...next.addressHashes, addressHash];
  }
  const attempts = next.failedAttempts + next.heldAttempts;
  const noticeDue =
    attempts >= ACCOUNT_LIMITS.noticeAfterAttempts &&
    (!next.notifiedAt || now.getTime() - next.notifiedAt.getTime() >= ACCOUNT_LIMITS.noticeEveryHours * HOUR);
  if (noticeDue) next.notifiedAt = now;
  return { next, noticeDue };
}

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

/** A keyed hash of the e-mail address as typed: rows exist for addresses with no account too. */
export function accountKey(email: string): string {
  return createHmac("sha256", env.AUDIT_IP_SALT).update(`sign-in:${normaliseEmail(email)}`).digest("hex").slice(0, 40);
}

type RequestLike = { headers: Headers } | null | undefined;

function addressHashOf(request: RequestLike): string {
  return hashIp(limiterAddress(clientIp(request?.headers ?? new Headers())));
}

async function userIdForEmail(email: string, tx: Executor = db): Promise<string | null> {
  const [row] = await tx.select({ id: user.id }).from(user).where(sql`lower(${user.email}) = ${normaliseEmail(email)}`);
  return row?.id ?? null;
}

// ---- known devices ---------------------------------------------------------------------------

/** The signed value of the known-device cookie: whose device, and a random id for its own count. */
export function newKnownDeviceValue(userId: string): string {
  return `${userId}.${randomBytes(16).toString("base64url")}`;
}

function parseKnownDevice(value: string | null | undefined): { userId: string; deviceId: string } | null {
  if (!value) return null;
  const dot = value.lastIndexOf(".");
  if (dot <= 0) return null;
  return { userId: value.slice(0, dot), deviceId: value.slice(dot + 1) };
}

const deviceKey = (deviceId: string) => `sign-in-device:${deviceId}`;

async function isTrustedDevice(knownDevice: string | null | undefined, userId: string | null): Promise<boolean> {
  const device = parseKnownDevice(knownDevice);
  if (!device || !userId || device.userId !== userId) return false;
  const failures = await currentCount({ key: deviceKey(device.deviceId), windowSeconds: ACCOUNT_LIMITS.knownDeviceWindowSeconds });
  return failures < ACCOUNT_LIMITS.knownDeviceMaxFailures;
}

// ---- the three moments of a sign-in ------------------------------------------------------------

async function applyAndSave(
  { key, userId, kind, request }: { key: string; userId: string | null; kind: AttemptKind; request: RequestLike },
  tx: Executor,
) {
  const now = new Date();
  await tx.insert(signInThrottles).values({ accountKey: key, userId, lastAttemptAt: now, windowStartedAt: now }).onConflictDoNothing();
  const [row] = await tx.select().from(signInThrottles).where(eq(signInThrottles.accountKey, key)).for("update");
  const { next, noticeDue } = applyAttempt(row!, { kind, addressHash: addressHashOf(request), now });
  await tx
    .update(signInThrottles)
    .set({ ...next, userId: userId ?? row!.userId })
    .where(eq(signInThrottles.accountKey, key));
  const owner = userId ?? row!.userId;
  if (noticeDue && owner) {
    await sendSignInAttemptsNotice(
      {
        userId: owner,
        since: next.windowStartedAt,
        attempts: next.failedAttempts + next.heldAttempts,
        addresses: next.addressHashes.length,
        secondStepFailures: next.secondStepFailures,
        noticeKey: `${key}:${now.getTime()}`,
      },
      tx,
    );
    await audit(
      {
        action: "account.sign_in_attempts_notice",
        request: request ?? null,
        details: { accountUserId: owner, attempts: next.failedAttempts + next.heldAttempts, addresses: next.addressHashes.length, secondStepFailures: next.secondStepFailures },
      },
      tx,
    );
  }
  return next;
}

/**
 * Before a password is checked: seconds to wait, or 0 to go ahead. A held attempt is counted
 * (and may trigger the owner's e-mail) but never checked, and never makes the wait longer.
 */
export async function holdIfDelayed({ email, request, knownDevice }: { email: string; request: RequestLike; knownDevice?: string | null }): Promise<number> {
  const key = accountKey(email);
  const [row] = await db
    .select({ blockedUntil: signInThrottles.blockedUntil, userId: signInThrottles.userId })
    .from(signInThrottles)
    .where(and(eq(signInThrottles.accountKey, key), gt(signInThrottles.blockedUntil, sql`now()`)));
  if (!row?.blockedUntil) return 0;
  const userId = row.userId ?? (await userIdForEmail(email));
  if (await isTrustedDevice(knownDevice, userId)) return 0;
  await db.transaction((tx) => applyAndSave({ key, userId, kind: "held", request }, tx));
  return Math.max(1, Math.ceil((row.blockedUntil.getTime() - Date.now()) / 1000));
}

/** After a wrong password (by e-mail) or a wrong second-step code (by user id). */
export async function recordFailure({
  email,
  userId,
  step,
  request,
  knownDevice,
}: {
  email?: string;
  userId?: string;
  step: "password" | "second_step";
  request: RequestLike;
  knownDevice?: string | null;
}) {
  let address = email;
  let owner = userId ?? null;
  if (!address && owner) {
    const [u] = await db.select({ email: user.email }).from(user).where(eq(user.id, owner));
    address = u?.email;
  }
  if (!address) return;
  owner ??= await userIdForEmail(address);
  const device = parseKnownDevice(knownDevice);
  if (device && owner && device.userId === owner) {
    await countAttempt({ key: deviceKey(device.deviceId), windowSeconds: ACCOUNT_LIMITS.knownDeviceWindowSeconds });
  }
  const key = accountKey(address);
  await db.transaction(async (tx) => {
    const next = await applyAndSave({ key, userId: owner, kind: step, request }, tx);
    await audit(
      {
        action: "account.sign_in_failed",
        request: request ?? null,
        details: {
          ...(owner ? { accountUserId: owner } : { unknownAccount: true }),
          step,
          consecutiveFailures: next.consecutiveFailures,
          delaySeconds: delayAfter(next.consecutiveFailures),
        },
      },
      tx,
    );
  });
}

/** After a full sign-in (password, and the second step where there is one): the run ends. */
export async function recordSuccess({ userId, role, request }: { userId: string; role: "admin" | "clinician" | "patient" | "carer"; request: RequestLike }) {
  await db.transaction(async (tx) => {
    await tx.update(signInThrottles).set({ consecutiveFailures: 0, blockedUntil: null }).where(eq(signInThrottles.userId, userId));
    await audit({ action: "account.sign_in", actor: { userId, role }, request: request ?? null }, tx);
  });
}

/** After a password reset by e-mail (OWASP: the reset still works while an account is held). */
export async function clearDelay({ userId }: { userId: string }, tx: Executor = db) {
  await tx.update(signInThrottles).set({ consecutiveFailures: 0, blockedUntil: null }).where(eq(signInThrottles.userId, userId));
}
