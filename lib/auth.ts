import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { APIError } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { account, rateLimit, session, user, verification } from "@/db/schema";
import { hashPassword, PASSWORD_MIN_LENGTH, verifyPassword } from "./auth/password";
import { authSecret, env } from "./env";

const trustedProxies = (process.env.TRUSTED_PROXIES ?? "").split(",").map((s) => s.trim()).filter(Boolean);

export const SIGN_IN_WINDOW_SECONDS = 60;
export const SIGN_IN_MAX_ATTEMPTS = Number(process.env.SIGN_IN_MAX_ATTEMPTS ?? 10);

export const auth = betterAuth({
  appName: "Caddis",
  baseURL: env.APP_URL,
  secret: authSecret(),
  trustedOrigins: [env.APP_URL],
  database: drizzleAdapter(db, {
    provider: "pg",
    schema: { user, session, account, verification, rateLimit },
  }),
  emailAndPassword: {
    enabled: true,
    // Accounts are made by admins, by clinicians (patients) and by invitation (carers).
    disableSignUp: true,
    minPasswordLength: PASSWORD_MIN_LENGTH,
    maxPasswordLength: 256,
    password: { hash: hashPassword, verify: verifyPassword },
  },
  user: {
    additionalFields: {
      role: { type: "string", required: true, defaultValue: "patient", input: false },
      locale: { type: "string", required: true, defaultValue: "en", input: false },
      deactivatedAt: { type: "date", required: false, input: false },
    },
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
  plugins: [nextCookies()],
});

export type AuthSession = typeof auth.$Infer.Session;
