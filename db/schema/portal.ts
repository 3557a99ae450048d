// What patients and carers record: check-ins, diary entries and uploads.
import { sql } from "drizzle-orm";
import { check, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { patients } from "./patients";
import { TRIAGE_LEVELS } from "@/lib/clinical";
import { CONTRASTS } from "@/lib/validations/reading";


export const checkIns = pgTable(
  "check_ins",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    reportedByUserId: text("reported_by_user_id").references(() => user.id, { onDelete: "set null" }),
    answers: jsonb("answers").$type<Record<string, unknown>>().notNull(),
    level: text("level", { enum: TRIAGE_LEVELS }).notNull(),
    ruleIds: text("rule_ids").array().notNull(),
    idempotencyKey: text("idempotency_key").notNull().unique(),
    // When the person answered, as the phone tells it (an offline check-in arrives later).
    answeredAt: timestamp("answered_at", { withTimezone: true }),
    reviewedAt: timestamp("reviewed_at", { withTimezone: true }),
    reviewedByUserId: text("reviewed_by_user_id").references(() => user.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [index("check_ins_patient_idx").on(t.patientId, t.createdAt)],
);

export const diaryEntries = pgTable(
  "diary_entries",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: ["in", "out"] }).notNull(),
    volumeMl: integer("volume_ml").notNull(),
    at: timestamp("at", { withTimezone: true }).notNull(),
    recordedByUserId: text("recorded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    // Made on the phone with the entry: a resend from its offline queue is the same entry.
    clientKey: uuid("client_key").unique(),
    ...timestamps,
  },
  (t) => [
    index("diary_patient_at_idx").on(t.patientId, t.at),
    check("diary_volume_ck", sql`${t.volumeMl} > 0 and ${t.volumeMl} <= 5000`),
  ],
);

export const uploads = pgTable(
  "uploads",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    uploadedByUserId: text("uploaded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    category: text("category", { enum: ["packaging-label", "discharge-letter", "site-photo", "other"] }).notNull(),
    // Server-chosen key; the user's file name is kept only as a label.
    objectKey: text("object_key").notNull().unique(),
    label: text("label").notNull(),
    contentType: text("content_type"),
    sizeBytes: integer("size_bytes"),
    // "removed": a care-team clinician took it off the record; the bytes are deleted from the store.
    status: text("status", { enum: ["pending", "ready", "rejected", "removed"] }).notNull().default("pending"),
    ...timestamps,
  },
  (t) => [
    index("uploads_patient_idx").on(t.patientId, t.createdAt),
    check("uploads_size_ck", sql`${t.sizeBytes} is null or ${t.sizeBytes} > 0`),
  ],
);

export type CheckIn = typeof checkIns.$inferSelect;
export type DiaryEntry = typeof diaryEntries.$inferSelect;
export type Upload = typeof uploads.$inferSelect;

// Reading comfort, per person (patient or carer), on every phone they use: a text size step
// (lib/validations/reading TEXT_SIZES) and the contrast.
export const readingPreferences = pgTable(
  "reading_preferences",
  {
    userId: text("user_id")
      .primaryKey()
      .references(() => user.id, { onDelete: "cascade" }),
    textSize: integer("text_size").notNull().default(0),
    contrast: text("contrast", { enum: CONTRASTS }).notNull().default("standard"),
    ...timestamps,
  },
  (t) => [check("reading_preferences_text_size", sql`${t.textSize} between 0 and 3`)],
);

// One browser's Web Push subscription (a phone, a laptop), per person. A push service answering
// 404/410 for it removes the row (lib/push).
export const pushSubscriptions = pgTable(
  "push_subscriptions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    endpoint: text("endpoint").notNull(),
    p256dh: text("p256dh").notNull(),
    auth: text("auth").notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex("push_subscriptions_endpoint_idx").on(t.endpoint), index("push_subscriptions_user_idx").on(t.userId)],
);
export type PushSubscriptionRow = typeof pushSubscriptions.$inferSelect;

/** One reminder the person chose: on or off, the times of day ("HH:MM"), the weekday of a weekly one (0 = Sunday), and how it comes. */
export type ReminderChoice = { on: boolean; times: string[]; day?: number; channel: "push" | "sms" | "email" };

// How the portal reaches a person (patient or carer): the mobile number for texts (E.164) and
// when they agreed to texts, quiet hours, and the reminders they chose (lib/portal/reach.ts).
export const reachSettings = pgTable(
  "reach_settings",
  {
    userId: text("user_id")
      .primaryKey()
      .references(() => user.id, { onDelete: "cascade" }),
    phone: text("phone"),
    smsConsentAt: timestamp("sms_consent_at", { withTimezone: true }),
    quietStart: text("quiet_start").notNull().default("22:00"),
    quietEnd: text("quiet_end").notNull().default("07:00"),
    reminders: jsonb("reminders").$type<Partial<Record<string, ReminderChoice>>>().notNull().default(sql`'{}'::jsonb`),
    ...timestamps,
  },
  (t) => [
    check("reach_settings_phone_ck", sql`${t.phone} is null or ${t.phone} ~ '^\\+[1-9][0-9]{6,14}$'`),
    check("reach_settings_quiet_ck", sql`${t.quietStart} ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$' and ${t.quietEnd} ~ '^([01][0-9]|2[0-3]):[0-5][0-9]$'`),
  ],
);
export type ReachSettings = typeof reachSettings.$inferSelect;
