// The outbox (every e-mail before it is sent) and GP supply requests.
import { sql } from "drizzle-orm";
import { boolean, check, index, integer, jsonb, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { patients } from "./patients";
import { catheterEpisodes } from "./catheters";
import type { SupplyItemKind } from "@/lib/clinical";

export const outboundStatuses = ["queued", "sending", "sent", "failed"] as const;
/** How a message leaves: e-mail (to an address), a text (to an E.164 number), a push (to one stored subscription's id). */
export const outboundChannels = ["email", "sms", "push"] as const;
export type OutboundChannel = (typeof outboundChannels)[number];
export type OutboundStatus = (typeof outboundStatuses)[number];
/** Rendered at send time from its descriptor, so the outbox row stays small. */
export type AttachmentDescriptor = { kind: string; filename: string; params: Record<string, string> };

export const outboundMessages = pgTable(
  "outbound_messages",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    // One message per causing event: a retry of the same event cannot queue a second copy.
    idempotencyKey: text("idempotency_key").notNull().unique(),
    // The RFC 5322 Message-ID, derived from the idempotency key: a copy sent twice (a worker
    // killed after the server accepted it) carries the same id and is recognisable.
    messageId: text("message_id").notNull(),
    kind: text("kind").notNull(),
    channel: text("channel", { enum: outboundChannels }).notNull().default("email"),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    html: text("html").notNull(),
    text: text("text").notNull(),
    // A push: the page its notification opens (a path in the app).
    link: text("link"),
    attachments: jsonb("attachments").$type<AttachmentDescriptor[]>()
      .notNull()
      .default(sql`'[]'::jsonb`),
    locale: text("locale").notNull().default("en"),
    patientId: uuid("patient_id").references(() => patients.id, { onDelete: "cascade" }),
    // The receiving organisation (GP practice, care team), so a resend goes to its current inbox.
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    // What caused it (an episode event, passport, check-in, supply request…), for the record.
    sourceId: text("source_id"),
    resendOfId: uuid("resend_of_id"),
    createdByUserId: text("created_by_user_id").references(() => user.id, { onDelete: "set null" }),
    // Bodies holding a one-time secret (an activation code, an invitation link) are blanked once
    // sent, so the secret does not stay readable in the record; such a message is never resent.
    redactAfterSend: boolean("redact_after_send").notNull().default(false),
    status: text("status", { enum: outboundStatuses }).notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    lastError: text("last_error"),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    // While 'sending': the claim of one worker. A worker that dies leaves the lease to run out,
    // and the message is claimed again (at-least-once; see docs/email.md).
    claimToken: uuid("claim_token"),
    leaseUntil: timestamp("lease_until", { withTimezone: true }),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("outbox_status_idx").on(t.status, t.nextAttemptAt),
    index("outbox_lease_idx").on(t.leaseUntil).where(sql`${t.status} = 'sending'`),
    index("outbox_patient_idx").on(t.patientId, t.createdAt),
    index("outbox_resend_of_idx").on(t.resendOfId),
    check("outbox_attempts_ck", sql`${t.attempts} >= 0`),
    check("outbox_sent_ck", sql`${t.status} <> 'sent' or ${t.sentAt} is not null`),
    check("outbox_sending_ck", sql`${t.status} <> 'sending' or (${t.leaseUntil} is not null and ${t.claimToken} is not null)`),
    check("outbox_to_ck", sql`${t.toAddress} <> '' or ${t.status} = 'failed'`),
    check("outbox_channel_ck", sql`${t.channel} in ('email', 'sms', 'push')`),
  ],
);

export type SupplyRequestItem = {
  item: SupplyItemKind;
  /** From lib/clinical suppliesFor for the period. */
  computed: number;
  /** What the nurse asked for after review. */
  quantity: number;
  intervalDays: number;
};

// A request to the GP practice to prescribe supplies for a period, kept in the record.
export const supplyRequests = pgTable(
  "supply_requests",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    episodeId: uuid("episode_id").references(() => catheterEpisodes.id, { onDelete: "set null" }),
    gpPracticeId: uuid("gp_practice_id").references(() => organisations.id, { onDelete: "set null" }),
    periodDays: integer("period_days").notNull(),
    items: jsonb("items").$type<SupplyRequestItem[]>().notNull(),
    note: text("note"),
    requestedByUserId: text("requested_by_user_id").references(() => user.id, { onDelete: "set null" }),
    requestedByName: text("requested_by_name").notNull(),
    messageId: uuid("message_id").references(() => outboundMessages.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [
    index("supply_requests_patient_idx").on(t.patientId, t.createdAt),
    check("supply_requests_period_ck", sql`${t.periodDays} between 1 and 366`),
  ],
);

export type OutboundMessage = typeof outboundMessages.$inferSelect;
export type NewOutboundMessage = typeof outboundMessages.$inferInsert;
export type SupplyRequest = typeof supplyRequests.$inferSelect;
export type NewSupplyRequest = typeof supplyRequests.$inferInsert;
