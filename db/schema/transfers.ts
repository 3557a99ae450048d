// Transfer of care: referrals from one care-team organisation to another, and the discharge
// checklist the discharging nurse fills in (kept on the record, printed in the booklet and the
// GP summary).
import { sql } from "drizzle-orm";
import { boolean, check, date, index, integer, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { DISCHARGE_TEACHING, DRAINAGE_KINDS, REFERRAL_STATUSES } from "../../lib/clinical/record-vocabulary";
import { user } from "./auth";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { patients } from "./patients";

export const referrals = pgTable(
  "referrals",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    fromOrganisationId: uuid("from_organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    toOrganisationId: uuid("to_organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    referredByUserId: text("referred_by_user_id").references(() => user.id, { onDelete: "set null" }),
    handoverNote: text("handover_note").notNull(),
    status: text("status", { enum: REFERRAL_STATUSES }).notNull().default("pending"),
    // The referrer's choice: their own team stays on the care team once accepted, or leaves.
    referrerStays: boolean("referrer_stays").notNull(),
    declineReason: text("decline_reason"),
    answeredByUserId: text("answered_by_user_id").references(() => user.id, { onDelete: "set null" }),
    answeredAt: timestamp("answered_at", { withTimezone: true }),
    // The last time the referral was sent again to the receiving team, unanswered.
    remindedAt: timestamp("reminded_at", { withTimezone: true }),
    reminders: integer("reminders").notNull().default(0),
    ...timestamps,
  },
  (t) => [
    index("referrals_patient_idx").on(t.patientId),
    index("referrals_to_idx").on(t.toOrganisationId, t.status),
    index("referrals_from_idx").on(t.fromOrganisationId, t.status),
    // One open referral per patient and receiving team.
    uniqueIndex("referrals_one_pending_uq").on(t.patientId, t.toOrganisationId).where(sql`${t.status} = 'pending'`),
    check("referrals_other_team_ck", sql`${t.fromOrganisationId} <> ${t.toOrganisationId}`),
    check("referrals_decline_reason_ck", sql`${t.status} <> 'declined' or length(trim(coalesce(${t.declineReason}, ''))) > 0`),
    check("referrals_answered_ck", sql`${t.status} = 'pending' or ${t.answeredAt} is not null`),
  ],
);

export const dischargeChecklists = pgTable(
  "discharge_checklists",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    referralId: uuid("referral_id").references(() => referrals.id, { onDelete: "set null" }),
    recordedByUserId: text("recorded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    recordedByName: text("recorded_by_name").notNull(),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    // The items taught (DISCHARGE_TEACHING); an item not in the list was not taught.
    taught: text("taught", { enum: DISCHARGE_TEACHING }).array().notNull().default(sql`'{}'::text[]`),
    suppliesGiven: boolean("supplies_given").notNull(),
    suppliesDays: integer("supplies_days"),
    drainage: text("drainage", { enum: DRAINAGE_KINDS }),
    plannedTwocOn: date("planned_twoc_on"),
    firstVisitOn: date("first_visit_on"),
    portalActivationGiven: boolean("portal_activation_given").notNull(),
    notes: text("notes"),
    ...timestamps,
  },
  (t) => [
    index("discharge_checklists_patient_idx").on(t.patientId, t.createdAt),
    check("discharge_checklists_supplies_ck", sql`${t.suppliesDays} is null or (${t.suppliesDays} between 1 and 366)`),
  ],
);

export type Referral = typeof referrals.$inferSelect;
export type DischargeChecklist = typeof dischargeChecklists.$inferSelect;
