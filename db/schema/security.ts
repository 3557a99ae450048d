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
