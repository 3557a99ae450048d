// Visits from outside the care team: time-limited access and NEWS2 observations.
import { sql } from "drizzle-orm";
import { boolean, check, index, integer, jsonb, numeric, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { patients } from "./patients";
import { episodeEvents } from "./catheters";
import { checkIns } from "./portal";
import { ACKNOWLEDGE_ACTIONS, CASELOAD_ITEM_KINDS, CONSCIOUSNESS_LEVELS, NEWS2_RESPONSE_KEYS, NEWS2_RISKS } from "@/lib/clinical";

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

// What stays on the care team's caseload until a nurse deals with it: an urgent or emergency
// check-in or an alerting NEWS2 (acknowledged with what was done; re-sent to the team when not
// acknowledged by `dueAt`), and a urine sample's result to chase (closed when marked done).
/** Who reported an alert: named in the alert e-mail so the team knows whom to call back. */
export type AlertReporter =
  | { kind: "patient" }
  | { kind: "carer"; name: string }
  | { kind: "clinician"; name: string; organisation: string | null; phone: string | null };

export const caseloadItems = pgTable(
  "caseload_items",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: CASELOAD_ITEM_KINDS }).notNull(),
    /** check-in: urgent | emergency; NEWS2: its risk band; sample-result: null. */
    level: text("level"),
    checkInId: uuid("check_in_id").references(() => checkIns.id, { onDelete: "cascade" }),
    observationId: uuid("observation_id").references(() => observations.id, { onDelete: "cascade" }),
    eventId: uuid("event_id").references(() => episodeEvents.id, { onDelete: "set null" }),
    /** What was reported, in plain words; who reported it (lib/email AlertReporter) and their notes. */
    summary: text("summary").notNull(),
    reporter: jsonb("reporter").$type<AlertReporter>(),
    reporterNotes: text("reporter_notes"),
    /** When it is sent to the team again if nobody has acknowledged it (alerts only). */
    dueAt: timestamp("due_at", { withTimezone: true }),
    resentAt: timestamp("resent_at", { withTimezone: true }),
    closedAt: timestamp("closed_at", { withTimezone: true }),
    closedByUserId: text("closed_by_user_id").references(() => user.id, { onDelete: "set null" }),
    closedByName: text("closed_by_name"),
    action: text("action", { enum: ACKNOWLEDGE_ACTIONS }),
    note: text("note"),
    ...timestamps,
  },
  (t) => [
    index("caseload_items_patient_idx").on(t.patientId, t.createdAt),
    index("caseload_items_open_idx").on(t.dueAt).where(sql`${t.closedAt} is null`),
    uniqueIndex("caseload_items_check_in_uq").on(t.checkInId),
    uniqueIndex("caseload_items_observation_uq").on(t.observationId),
    check("caseload_items_closed_ck", sql`${t.closedAt} is null or (${t.closedByName} is not null and (${t.kind} = 'sample-result' or ${t.action} is not null))`),
    check("caseload_items_other_note_ck", sql`${t.action} is distinct from 'other' or length(trim(coalesce(${t.note}, ''))) > 0`),
  ],
);

export type CaseloadItem = typeof caseloadItems.$inferSelect;
export type VisitAccess = typeof visitAccess.$inferSelect;
export type Observation = typeof observations.$inferSelect;
export type NewObservation = typeof observations.$inferInsert;
