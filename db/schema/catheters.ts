// Catheter episodes (one catheter in one patient, insertion to removal), their events and bag changes.
// Enum values are lib/clinical's own, so a row can be handed to the rules as it is.
import { sql } from "drizzle-orm";
import {
  BAG_KINDS,
  CATHETER_TYPES,
  EPISODE_EVENT_KINDS,
  GEL_KINDS,
  LENGTH_CATEGORIES,
  MATERIALS,
  ROUTES,
  TWOC_OUTCOMES,
  UNPLANNED_REASONS,
} from "@/lib/clinical";
import { boolean, check, date, index, integer, jsonb, numeric, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { patients } from "./patients";

export const catheterEpisodes = pgTable(
  "catheter_episodes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    previousEpisodeId: uuid("previous_episode_id"),
    route: text("route", { enum: ROUTES }).notNull(),
    catheterType: text("catheter_type", { enum: CATHETER_TYPES }).notNull(),
    material: text("material", { enum: MATERIALS }).notNull(),
    lengthCategory: text("length_category", { enum: LENGTH_CATEGORIES }).notNull(),
    sizeCh: integer("size_ch").notNull(),
    balloonMl: integer("balloon_ml").notNull(),
    makerBalloonMl: integer("maker_balloon_ml"),
    maker: text("maker"),
    productName: text("product_name"),
    lot: text("lot"),
    expiry: date("expiry"),
    gtin: text("gtin"),
    serial: text("serial"),
    udi: text("udi"),
    indication: text("indication").notNull(),
    insertedAt: timestamp("inserted_at", { withTimezone: true }).notNull(),
    insertedByUserId: text("inserted_by_user_id").references(() => user.id, { onDelete: "set null" }),
    insertedByName: text("inserted_by_name").notNull(),
    gelKind: text("gel_kind", { enum: GEL_KINDS }).notNull().default("none"),
    gelVolumeMl: numeric("gel_volume_ml", { precision: 4, scale: 1, mode: "number" }),
    residualUrineMl: integer("residual_urine_ml"),
    urineDescription: text("urine_description"),
    specimenTaken: boolean("specimen_taken").notNull().default(false),
    attempts: integer("attempts").notNull().default(1),
    difficulties: text("difficulties"),
    patientReaction: text("patient_reaction"),
    largerSizeReason: text("larger_size_reason"),
    maxDwellDays: integer("max_dwell_days"),
    reviewIntervalDays: integer("review_interval_days"),
    plannedChangeOn: date("planned_change_on").notNull(),
    reviewDueOn: date("review_due_on").notNull(),
    // Findings of the device check at save time, and the override reasons for any `stop`.
    findings: jsonb("findings").$type<unknown[]>().notNull().default(sql`'[]'::jsonb`),
    overrides: jsonb("overrides").$type<{ code: string; reason: string }[]>().notNull().default(sql`'[]'::jsonb`),
    awaitingTwoc: boolean("awaiting_twoc").notNull().default(false),
    // The trial without catheter planned for this catheter: the day, and any medicine given
    // before it (for example an alpha-blocker), as the nurse wrote it.
    twocPlannedOn: date("twoc_planned_on"),
    twocMedicineNote: text("twoc_medicine_note"),
    removedAt: timestamp("removed_at", { withTimezone: true }),
    removalReason: text("removal_reason"),
    ...timestamps,
  },
  (t) => [
    index("episodes_patient_idx").on(t.patientId, t.insertedAt),
    // At most one catheter in place per patient.
    uniqueIndex("episodes_one_active_uq").on(t.patientId).where(sql`${t.removedAt} is null`),
    // The caseload walks this in change-date order and tests "due soon" by either date inside
    // the index, so a page of 50 at 100,000 patients reads only its own rows.
    index("episodes_active_change_review_idx").on(t.plannedChangeOn, t.reviewDueOn).where(sql`${t.removedAt} is null`),
    index("episodes_active_review_idx").on(t.reviewDueOn).where(sql`${t.removedAt} is null`),
    // The caseload's other orders and its trial filter walk these (db/queries/caseload.ts).
    index("episodes_active_inserted_idx").on(t.insertedAt).where(sql`${t.removedAt} is null`),
    index("episodes_active_twoc_idx")
      .on(t.plannedChangeOn)
      .where(sql`${t.removedAt} is null and (${t.awaitingTwoc} or ${t.twocPlannedOn} is not null)`),
    // A trial under way: the catheter is out and its outcome is not recorded.
    index("episodes_trial_awaiting_idx").on(t.patientId).where(sql`${t.awaitingTwoc} and ${t.removedAt} is not null`),
    check("episodes_size_ck", sql`${t.sizeCh} between 6 and 30`),
    check("episodes_balloon_ck", sql`${t.balloonMl} > 0 and ${t.balloonMl} <= 30`),
    check("episodes_maker_balloon_ck", sql`${t.makerBalloonMl} is null or ${t.makerBalloonMl} > 0`),
    check("episodes_gel_volume_ck", sql`${t.gelVolumeMl} is null or ${t.gelVolumeMl} >= 0`),
    check("episodes_residual_ck", sql`${t.residualUrineMl} is null or ${t.residualUrineMl} >= 0`),
    check("episodes_attempts_ck", sql`${t.attempts} >= 1`),
    check("episodes_dwell_ck", sql`${t.maxDwellDays} is null or ${t.maxDwellDays} > 0`),
    check("episodes_removed_ck", sql`${t.removedAt} is null or ${t.removedAt} >= ${t.insertedAt}`),
  ],
);

export const episodeEvents = pgTable(
  "episode_events",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    episodeId: uuid("episode_id")
      .notNull()
      .references(() => catheterEpisodes.id, { onDelete: "cascade" }),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: EPISODE_EVENT_KINDS }).notNull(),
    reason: text("reason", { enum: UNPLANNED_REASONS }),
    twocOutcome: text("twoc_outcome", { enum: TWOC_OUTCOMES }),
    notes: text("notes"),
    details: jsonb("details").$type<Record<string, unknown>>().notNull().default(sql`'{}'::jsonb`),
    occurredAt: timestamp("occurred_at", { withTimezone: true }).notNull(),
    recordedByUserId: text("recorded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    recordedByName: text("recorded_by_name").notNull(),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [
    index("events_patient_idx").on(t.patientId, t.occurredAt),
    index("events_episode_idx").on(t.episodeId),
    check("events_reason_ck", sql`${t.kind} <> 'unplanned_change' or ${t.reason} is not null`),
    check("events_twoc_ck", sql`${t.kind} <> 'twoc_outcome' or ${t.twocOutcome} is not null`),
  ],
);

// "I changed my leg bag / valve today", logged by the patient or carer; the next change is
// worked out by lib/clinical nextBagChange from the latest row of each kind.
export const bagChanges = pgTable(
  "bag_changes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: BAG_KINDS }).notNull(),
    changedOn: date("changed_on").notNull(),
    recordedByUserId: text("recorded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [index("bag_changes_patient_idx").on(t.patientId, t.kind, t.changedOn)],
);

export type CatheterEpisode = typeof catheterEpisodes.$inferSelect;
export type NewCatheterEpisode = typeof catheterEpisodes.$inferInsert;
export type EpisodeEvent = typeof episodeEvents.$inferSelect;
export type NewEpisodeEvent = typeof episodeEvents.$inferInsert;
export type BagChange = typeof bagChanges.$inferSelect;
