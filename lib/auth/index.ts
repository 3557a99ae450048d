import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { APIError, createAuthMiddleware, getSessionFromCtx } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { twoFactor as twoFactorPlugin } from "better-auth/plugins/two-factor";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { twoFactorRequiredFor } from "@/db/queries/access";
import { account, rateLimit, session, twoFactor, user, verification } from "@/db/schema";
import { sendPasswordReset } from "@/lib/admin/mail";
import { audit } from "@/lib/records/audit";
import { hashPassword, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH, passwordProblem, verifyPassword } from "@/lib/auth/password";
import { ACCOUNT_LIMITS, clearDelay, holdIfDelayed, newKnownDeviceValue, recordFailure, recordSuccess } from "@/lib/auth/sign-in-throttle";
import { cookiePrefixFor } from "@/lib/auth/cookies";
import { authSecret, env } from "@/lib/config/env";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

export const SIGN_IN_WINDOW_SECONDS = 60;
export const RESET_LINK_SECONDS = 60 * 60;
export const SIGN_IN_MAX_ATTEMPTS = Number(process.env.SIGN_IN_MAX_ATTEMPTS ?? 10);

export const auth = betterAuth({
  appName: "Caddis",
  baseURL: env.APP_URL,
  secret: authSecret(),
  trustedOrigins: [env.APP_URL],
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: { user, session, account, verification, rateLimit, twoFactor },
  }),
  // Listing and ending sessions go through Caddis's own routes (app/api/account/sessions), which
  // never hand a token to the browser; better-auth's would (they take and return tokens).
  disabledPaths: ["/list-sessions", "/revoke-session", "/revoke-sessions", "/revoke-other-sessions"],
  // Reset-password and two-factor identifiers are kept only as hashes.
  verification: { storeIdentifier: "hashed" },
  emailAndPassword: {
    enabled: true,
    // Accounts are made by admins, by clinicians (patients) and by invitation (carers).
    disableSignUp: true,
    minPasswordLength: PASSWORD_MIN_LENGTH,
    maxPasswordLength: PASSWORD_MAX_LENGTH,
    password: { hash: hashPassword, verify: verifyPassword },
    resetPasswordTokenExpiresIn: RESET_LINK_SECONDS,
    // A reset ends every session, so whoever knew the old password is signed out.
    revokeSessionsOnPasswordReset: true,
    // Through the outbox, in the account's language (lib/admin/mail.ts).
    sendResetPassword: async ({ user: u, url }) => {
      await sendPasswordReset({ userId: u.id, email: u.email, name: u.name, url, expiresInSeconds: RESET_LINK_SECONDS });
    },
    onPasswordReset: async ({ user: u }, request) => {
      // The reset works while sign-in is being held back, and ends the hold (OWASP).
      await clearDelay({ userId: u.id });
      await audit({ action: "account.password_reset", actor: { userId: u.id, role: roleOf(u) }, request: request ?? null });
    },
  },
  user: {
    additionalFields: {
      role: { type: "string", required: true, defaultValue: "patient", input: false },
      locale: { type: "string", required: true, defaultValue: "en", input: false },
      deactivatedAt: { type: "date", required: false, input: false },
    },
    // Staff change their password on the account page (with the current one); nothing else.
    changeEmail: { enabled: false },
  },
  session: {
    // Sessions live in PostgreSQL; no cookie cache, so ending a session bites at once.
    expiresIn: 60 * 60 * 24 * 7,
    updateAge: 60 * 60 * 24,
    cookieCache: { enabled: false },
  },
  rateLimit: {
    enabled: true,
    storage: "database",
    window: 10,
    max: 100,
    customRules: {
      "/sign-in/email": { window: SIGN_IN_WINDOW_SECONDS, max: SIGN_IN_MAX_ATTEMPTS },
      "/forget-password": { window: 60, max: 3 },
      "/reset-password": { window: 60, max: 5 },
    },
  },
  advanced: {
    // The address the server entry worked out (lib/http/client-ip.ts), never a client's header.
    ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
    // Over https every auth cookie is `__Host-caddis.*`: Secure, Path=/, no Domain (better-auth's
    // own secure prefix is __Secure-, so its switch stays off and the prefix and flag are set here).
    cookiePrefix: cookiePrefixFor(env.APP_URL),
    useSecureCookies: false,
    defaultCookieAttributes: { secure: env.APP_URL.startsWith("https://"), sameSite: "lax", path: "/", httpOnly: true },
  },
  databaseHooks: {
    session: {
      create: {
        // A deactivated account gets no new session.
        before: async (s) => {
          const [u] = await db.select({ deactivatedAt: user.deactivatedAt }).from(user).where(eq(user.id, s.userId));
          if (!u || u.deactivatedAt) throw new APIError("FORBIDDEN", { message: "This account is not active." });
          return { data: s };
        },
      },
    },
  },
  hooks: {
    // Caddis's password rules (ASVS 6.2.4) on every path that sets a password, no turning off
    // two-factor where an organisation requires it, and the per-account sign-in delay.
    before: createAuthMiddleware(async (ctx) => {
      if (ctx.path === "/sign-in/email") {
        const wait = await holdIfDelayed({ email: String(ctx.body?.email ?? ""), request: requestOf(ctx), knownDevice: await readKnownDevice(ctx) });
        if (wait > 0) {
          throw new APIError(
            "TOO_MANY_REQUESTS",
            { message: "Too many wrong tries for this account. Try again later, or reset the password.", code: "ACCOUNT_DELAYED", retryAfterSeconds: wait },
            { "Retry-After": String(wait) },
          );
        }
      }
      if (secondStepPaths.has(ctx.path) && !(await getSessionFromCtx(ctx))) {
        const userId = await pendingSecondStepUser(ctx);
        if (userId) pendingUsers.set(ctx.context, userId);
      }
      if (ctx.path === "/two-factor/disable") {
        const current = await getSessionFromCtx(ctx);
        if (current && (await twoFactorRequiredFor({ userId: current.user.id }))) {
          throw new APIError("FORBIDDEN", { message: "Your organisation requires two-step sign-in.", code: "TWO_FACTOR_REQUIRED" });
        }
      }
      if (ctx.path === "/reset-password" || ctx.path === "/change-password") {
        const problem = passwordProblem(String(ctx.body?.newPassword ?? ""));
        if (problem) throw new APIError("BAD_REQUEST", { message: passwordMessages[problem], code: problem.toUpperCase() });
      }
      // A new password ends every other session, whatever the client asked (ASVS 5.0.0 7.4.3).
      if (ctx.path === "/change-password") return { context: { body: { ...ctx.body, revokeOtherSessions: true } } };
    }),
    // Sign-ins count for or against the account (lib/auth/sign-in-throttle.ts); account security
    // changes are audit events.
    after: createAuthMiddleware(async (ctx) => {
      await countSignIn(ctx);
      await auditAccountChange(ctx);
      // Session tokens never reach page JavaScript: they travel only in the HttpOnly cookie. The
      // sign-in, second-step, password-change and session answers lose theirs (ASVS 5.0.0 7.2.x).
      const returned = ctx.context.returned;
      if (ctx.request && !isApiError(returned) && containsToken(returned)) return ctx.json(withoutTokens(returned) as Record<string, unknown>);
    }),
  },
  plugins: [
    twoFactorPlugin({
      issuer: "Caddis",
      backupCodeOptions: { amount: 10, length: 10, storeBackupCodes: "encrypted" },
      // Wrong codes are limited per sign-in attempt by the plugin and per address by rateLimit.
    }),
    nextCookies(),
  ],
});

const passwordMessages = {
  password_too_short: `Use at least ${PASSWORD_MIN_LENGTH} characters.`,
  password_too_long: `Use at most ${PASSWORD_MAX_LENGTH} characters.`,
  password_too_common: "This password is too common. Choose another.",
} as const;

const accountActions: Record<string, string> = {
  "/change-password": "account.password_change",
  "/two-factor/verify-totp": "account.two_factor_enable",
  "/two-factor/disable": "account.two_factor_disable",
  "/two-factor/generate-backup-codes": "account.backup_codes_regenerate",
};

type HookContext = Parameters<Parameters<typeof createAuthMiddleware>[0]>[0];

/** The request, or for a server-side `auth.api` call its headers (for the client address). */
function requestOf(ctx: HookContext): { headers: Headers } | null {
  return ctx.request ?? (ctx.headers ? { headers: ctx.headers } : null);
}

// A browser that has signed in to an account before (OWASP device cookies): not held back by
// that account's sign-in delay unless it has failed too often itself.
const KNOWN_DEVICE_COOKIE = "known_device";

async function readKnownDevice(ctx: HookContext) {
  const cookie = ctx.context.createAuthCookie(KNOWN_DEVICE_COOKIE);
  return (await ctx.getSignedCookie(cookie.name, ctx.context.secret)) || null;
}

async function rememberDevice(ctx: HookContext, userId: string) {
  const cookie = ctx.context.createAuthCookie(KNOWN_DEVICE_COOKIE, { maxAge: ACCOUNT_LIMITS.knownDeviceCookieDays * 24 * 60 * 60 });
  await ctx.setSignedCookie(cookie.name, newKnownDeviceValue(userId), ctx.context.secret, cookie.attributes);
}

const secondStepPaths = new Set(["/two-factor/verify-totp", "/two-factor/verify-backup-code"]);
// The account a second step is for, read before the plugin may spend the challenge.
const pendingUsers = new WeakMap<object, string>();

async function pendingSecondStepUser(ctx: HookContext): Promise<string | null> {
  const cookie = ctx.context.createAuthCookie("two_factor");
  const identifier = await ctx.getSignedCookie(cookie.name, ctx.context.secret);
  if (!identifier) return null;
  const row = await ctx.context.internalAdapter.findVerificationValue(identifier);
  return row?.value ?? null;
}

function isApiError(value: unknown): value is APIError {
  return value instanceof APIError || (value instanceof Error && "statusCode" in value);
}

async function countSignIn(ctx: HookContext) {
  const returned = ctx.context.returned;
  const request = requestOf(ctx);
  if (ctx.path === "/sign-in/email") {
    if (isApiError(returned)) {
      if (returned.statusCode === 401) {
        await recordFailure({ email: String(ctx.body?.email ?? ""), step: "password", request, knownDevice: await readKnownDevice(ctx) });
      }
      return;
    }
    const u = ctx.context.newSession?.user as { id: string; twoFactorEnabled?: boolean } | undefined;
    // With two-step sign-in the password alone is not a sign-in: the code decides.
    if (u && !u.twoFactorEnabled) {
      await recordSuccess({ userId: u.id, role: roleOf(u), request });
      await rememberDevice(ctx, u.id);
    }
    return;
  }
  if (!secondStepPaths.has(ctx.path)) return;
  const pending = pendingUsers.get(ctx.context);
  if (!pending) return;
  if (isApiError(returned)) {
    await recordFailure({ userId: pending, step: "second_step", request, knownDevice: await readKnownDevice(ctx) });
    return;
  }
  const u = ctx.context.newSession?.user;
  if (u) {
    await recordSuccess({ userId: u.id, role: roleOf(u), request });
    await rememberDevice(ctx, u.id);
  }
}

async function auditAccountChange(ctx: HookContext) {
  const action = accountActions[ctx.path];
  if (!action || isApiError(ctx.context.returned)) return;
  const u = ctx.context.session?.user ?? ctx.context.newSession?.user;
  // verify-totp without a session is the second step of a sign-in, not a set-up.
  if (!u || (ctx.path === "/two-factor/verify-totp" && !ctx.context.session)) return;
  await audit({ action, actor: { userId: u.id, role: roleOf(u) }, request: requestOf(ctx) });
}

const isPlainObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && Object.getPrototypeOf(v) === Object.prototype;

/** Whether an answer holds a `token` field at its top, or one level down (a session, a list of them). */
function containsToken(value: unknown): boolean {
  if (Array.isArray(value)) return value.some((v) => isPlainObject(v) && "token" in v);
  if (!isPlainObject(value)) return false;
  return "token" in value || Object.values(value).some((v) => isPlainObject(v) && "token" in v);
}

function withoutTokens(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withoutTokens);
  if (!isPlainObject(value)) return value;
  return Object.fromEntries(Object.entries(value).filter(([k]) => k !== "token").map(([k, v]) => [k, isPlainObject(v) ? withoutTokens(v) : v]));
}

type AuditRole = "admin" | "clinician" | "patient" | "carer";
function roleOf(u: object): AuditRole {
  const role = (u as { role?: unknown }).role;
  return (["admin", "clinician", "patient", "carer"] as const).find((r) => r === role) ?? "patient";
}

export type AuthSession = typeof auth.$Infer.Session;
