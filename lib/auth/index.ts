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
import { authSecret, env } from "@/lib/config/env";

const trustedProxies = (process.env.TRUSTED_PROXIES ?? "").split(",").map((s) => s.trim()).filter(Boolean);

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
    ipAddress: {
      ipAddressHeaders: env.CLIENT_IP_HEADER ? [env.CLIENT_IP_HEADER] : [],
      ...(trustedProxies.length ? { trustedProxies } : {}),
    },
    useSecureCookies: env.APP_URL.startsWith("https://"),
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
    // Caddis's password rules (ASVS 6.2.4) on every path that sets a password, and no turning
    // off two-factor where an organisation requires it.
    before: createAuthMiddleware(async (ctx) => {
      if (ctx.path === "/reset-password" || ctx.path === "/change-password") {
        const problem = passwordProblem(String(ctx.body?.newPassword ?? ""));
        if (problem) throw new APIError("BAD_REQUEST", { message: passwordMessages[problem], code: problem.toUpperCase() });
      }
      if (ctx.path === "/two-factor/disable") {
        const current = await getSessionFromCtx(ctx);
        if (current && (await twoFactorRequiredFor({ userId: current.user.id }))) {
          throw new APIError("FORBIDDEN", { message: "Your organisation requires two-step sign-in.", code: "TWO_FACTOR_REQUIRED" });
        }
      }
    }),
    // Account security changes are audit events.
    after: createAuthMiddleware(async (ctx) => {
      const action = accountActions[ctx.path];
      if (!action || ctx.context.returned instanceof Error) return;
      const u = ctx.context.session?.user ?? ctx.context.newSession?.user;
      // verify-totp without a session is the second step of a sign-in, not a set-up.
      if (!u || (ctx.path === "/two-factor/verify-totp" && !ctx.context.session)) return;
      await audit({ action, actor: { userId: u.id, role: roleOf(u) }, request: ctx.request ?? null });
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

type AuditRole = "admin" | "clinician" | "patient" | "carer";
function roleOf(u: object): AuditRole {
  const role = (u as { role?: unknown }).role;
  return (["admin", "clinician", "patient", "carer"] as const).find((r) => r === role) ?? "patient";
}

export type AuthSession = typeof auth.$Infer.Session;
