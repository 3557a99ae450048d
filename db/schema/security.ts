// The audit trail and attempt counters for rate limits.
import { sql } from "drizzle-orm";
import { bigserial, check, index, integer, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { patients } from "./patients";

import { AUDIT_VIA } from "../../lib/shared/audit-actions";

export const auditVia = AUDIT_VIA;

export const auditEvents = pgTable(
  "audit_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    actorUserId: text("actor_user_id").references(() => user.id, { onDelete: "set null" }),
    actorRole: text("actor_role"),
    action: text("action").notNull(),
    patientId: uuid("patient_id").references(() => patients.id, { onDelete: "set null" }),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    via: text("via", { enum: auditVia }),
    reason: text("reason"),
    // HMAC of the client address, never the address itself.
    ipHash: text("ip_hash"),
    details: jsonb("details").$type<Record<string, unknown>>().notNull().default(sql`'{}'::jsonb`),
    ...timestamps,
  },
  (t) => [
    index("audit_patient_idx").on(t.patientId, t.at),
    index("audit_actor_idx").on(t.actorUserId, t.at),
    index("audit_at_idx").on(t.at),
  ],
);

// Fixed-window attempt counters for our own endpoints (activation codes, carer invitations,
// the passport device card), in PostgreSQL so limits hold across app instances. better-auth's rate_limit is its own.
export const attemptCounters = pgTable(
  "attempt_counters",
  {
    key: text("key").primaryKey(),
    count: integer("count").notNull(),
    windowStartedAt: timestamp("window_started_at", { withTimezone: true }).notNull(),
  },
  (t) => [index("attempt_counters_window_idx").on(t.windowStartedAt), check("attempt_counters_count_ck", sql`${t.count} >= 0`)],
);

export type AuditEvent = typeof auditEvents.$inferSelect;
export type NewAuditEvent = typeof auditEvents.$inferInsert;

// Failed sign-ins per account, from any address (lib/auth/sign-in-throttle.ts): the growing delay
// and what the account's owner and the admins are told. Keyed by a keyed hash of the e-mail
// address as typed, so an address with no account is slowed the same way (nothing to enumerate).
export const signInThrottles = pgTable(
  "sign_in_throttles",
  {
    accountKey: text("account_key").primaryKey(),
    userId: text("user_id").references(() => user.id, { onDelete: "cascade" }),
    // Wrong passwords (or second-step codes) since the last full sign-in: they set the delay.
    consecutiveFailures: integer("consecutive_failures").notNull().default(0),
    // No attempt from a device this account has not signed in on is checked before this.
    blockedUntil: timestamp("blocked_until", { withTimezone: true }),
    // The reporting window (24 h from its first attempt): what the e-mail and the admin view count.
    windowStartedAt: timestamp("window_started_at", { withTimezone: true }).notNull().defaultNow(),
    failedAttempts: integer("failed_attempts").notNull().default(0),
    // Attempts held back by the delay (refused unchecked).
    heldAttempts: integer("held_attempts").notNull().default(0),
    // Wrong second-step codes after a right password: someone may know the password.
    secondStepFailures: integer("second_step_failures").notNull().default(0),
    // Keyed hashes of the addresses (IPv6 by /64) the window's attempts came from, at most 100.
    addressHashes: text("address_hashes").array().notNull().default(sql`'{}'::text[]`),
    lastAttemptAt: timestamp("last_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    notifiedAt: timestamp("notified_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("sign_in_throttles_user_idx").on(t.userId),
    index("sign_in_throttles_last_attempt_idx").on(t.lastAttemptAt),
    check("sign_in_throttles_counts_ck", sql`${t.consecutiveFailures} >= 0 and ${t.failedAttempts} >= 0 and ${t.heldAttempts} >= 0 and ${t.secondStepFailures} >= 0`),
  ],
);

export type SignInThrottle = typeof signInThrottles.$inferSelect;
