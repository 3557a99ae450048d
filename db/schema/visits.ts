// Visits from outside the care team: time-limited access and NEWS2 observations.
import { sql } from "drizzle-orm";
import { boolean, check, index, integer, jsonb, numeric, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { patients } from "./patients";
import { episodeEvents } from "./catheters";
import { CONSCIOUSNESS_LEVELS, NEWS2_RESPONSE_KEYS, NEWS2_RISKS } from "@/lib/clinical";

// Time-limited access for a clinician outside the care team, opened from the passport QR.
export const visitAccess = pgTable(
  "visit_access",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    reason: text("reason").notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index("visit_access_user_patient_idx").on(t.userId, t.patientId, t.expiresAt)],
);

// NEWS2 observations taken on a visit (RCP NEWS2 2017). The values as entered, and the score
// lib/clinical scoreNews2 gave on the server when they were saved (never recomputed on read).

export const observations = pgTable(
  "observations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    // The visit it was taken on.
    eventId: uuid("event_id").references(() => episodeEvents.id, { onDelete: "set null" }),
    takenAt: timestamp("taken_at", { withTimezone: true }).notNull(),
    respirationRate: integer("respiration_rate").notNull(),
    spo2: integer("spo2").notNull(),
    spo2Scale: integer("spo2_scale").notNull(),
    onOxygen: boolean("on_oxygen").notNull(),
    systolicBp: integer("systolic_bp").notNull(),
    pulse: integer("pulse").notNull(),
    consciousness: text("consciousness", { enum: CONSCIOUSNESS_LEVELS }).notNull(),
    temperatureC: numeric("temperature_c", { precision: 3, scale: 1, mode: "number" }).notNull(),
    news2Total: integer("news2_total").notNull(),
    news2Subscores: jsonb("news2_subscores").$type<Record<string, number>>().notNull(),
    news2Risk: text("news2_risk", { enum: NEWS2_RISKS }).notNull(),
    news2Response: text("news2_response", { enum: NEWS2_RESPONSE_KEYS }).notNull(),
    recordedByUserId: text("recorded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    recordedByName: text("recorded_by_name").notNull(),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [
    index("observations_patient_idx").on(t.patientId, t.takenAt),
    index("observations_event_idx").on(t.eventId),
    check("observations_scale_ck", sql`${t.spo2Scale} in (1, 2)`),
    check("observations_total_ck", sql`${t.news2Total} between 0 and 20`),
    check("observations_rr_ck", sql`${t.respirationRate} between 0 and 80`),
    check("observations_spo2_ck", sql`${t.spo2} between 20 and 100`),
    check("observations_sbp_ck", sql`${t.systolicBp} between 40 and 300`),
    check("observations_pulse_ck", sql`${t.pulse} between 20 and 300`),
    check("observations_temp_ck", sql`${t.temperatureC} between 25 and 45`),
  ],
);

export type VisitAccess = typeof visitAccess.$inferSelect;
export type Observation = typeof observations.$inferSelect;
export type NewObservation = typeof observations.$inferInsert;
