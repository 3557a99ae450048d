// Patients, their care team, carers and portal invitation codes.
import { sql } from "drizzle-orm";
import { boolean, check, date, index, integer, numeric, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { ALLERGY_ANSWERS } from "../../lib/clinical/allergies";
import { timestamps } from "./columns";
import { organisations } from "./organisations";
import { SEXES } from "@/lib/clinical";


export const patients = pgTable(
  "patients",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    // The patient's own sign-in, once activated.
    userId: text("user_id")
      .unique()
      .references(() => user.id, { onDelete: "set null" }),
    givenName: text("given_name").notNull(),
    familyName: text("family_name").notNull(),
    healthRecordNumber: text("health_record_number").notNull(),
    dateOfBirth: date("date_of_birth").notNull(),
    sex: text("sex", { enum: SEXES }).notNull(),
    preferredLocale: text("preferred_locale").notNull().default("en"),
    weightKg: numeric("weight_kg", { precision: 5, scale: 1, mode: "number" }),
    phone: text("phone"),
    // yes / no / not-asked: "not asked" (the default) is not "no", so the checks can warn.
    allergyLatex: text("allergy_latex", { enum: ALLERGY_ANSWERS }).notNull().default("not-asked"),
    allergyChlorhexidine: text("allergy_chlorhexidine", { enum: ALLERGY_ANSWERS }).notNull().default("not-asked"),
    allergyLidocaine: text("allergy_lidocaine", { enum: ALLERGY_ANSWERS }).notNull().default("not-asked"),
    allergyOther: text("allergy_other"),
    gpPracticeId: uuid("gp_practice_id").references(() => organisations.id, { onDelete: "set null" }),
    // Set by the care team; when present the portal gives no drink-more advice.
    fluidLimitMl: integer("fluid_limit_ml"),
    // Latest check-in level, kept here so the caseload needs no per-row lookup.
    latestCheckInLevel: text("latest_check_in_level", { enum: ["emergency", "urgent", "soon", "self-care"] }),
    latestCheckInAt: timestamp("latest_check_in_at", { withTimezone: true }),
    closedAt: timestamp("closed_at", { withTimezone: true }),
    // Discharged from the catheter caseload after a passed trial without catheter, to be seen
    // again on the follow-up review day; cleared when a catheter goes back in.
    catheterDischargedAt: timestamp("catheter_discharged_at", { withTimezone: true }),
    followUpReviewOn: date("follow_up_review_on"),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("patients_hrn_uq").on(t.healthRecordNumber),
    index("patients_family_name_idx").on(sql`lower(${t.familyName})`),
    index("patients_gp_idx").on(t.gpPracticeId),
    // The caseload's search ("contains", either name order or the record number): trigrams, so
    // it need not read every patient (db/queries/caseload.ts searchText is the same expression).
    index("patients_search_trgm_idx").using(
      "gin",
      sql`lower(${t.givenName} || ' ' || ${t.familyName} || E'\n' || ${t.familyName} || ' ' || ${t.givenName} || E'\n' || ${t.healthRecordNumber}) gin_trgm_ops`,
    ),
    // The caseload's "urgent" and "follow-up" filters start from these few patients.
    index("patients_urgent_idx").on(t.id).where(sql`${t.latestCheckInLevel} in ('urgent', 'emergency')`),
    index("patients_follow_up_idx").on(t.followUpReviewOn).where(sql`${t.followUpReviewOn} is not null`),
    check("patients_weight_ck", sql`${t.weightKg} is null or (${t.weightKg} > 0 and ${t.weightKg} < 500)`),
    check("patients_follow_up_ck", sql`${t.followUpReviewOn} is null or ${t.catheterDischargedAt} is not null`),
    check("patients_fluid_limit_ck", sql`${t.fluidLimitMl} is null or ${t.fluidLimitMl} > 0`),
    check(
      "patients_allergy_answers_ck",
      sql`${t.allergyLatex} in ('yes', 'no', 'not-asked') and ${t.allergyChlorhexidine} in ('yes', 'no', 'not-asked') and ${t.allergyLidocaine} in ('yes', 'no', 'not-asked')`,
    ),
  ],
);

export const careTeam = pgTable(
  "care_team",
  {
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    organisationId: uuid("organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    // The lead team: whose numbers the patient, the device card, the booklet and the alerts show.
    // At most one per patient, and always one of its care team (it is a row of it).
    lead: boolean("lead").notNull().default(false),
    ...timestamps,
  },
  (t) => [
    primaryKey({ columns: [t.patientId, t.organisationId] }),
    index("care_team_org_idx").on(t.organisationId, t.patientId),
    uniqueIndex("care_team_one_lead_uq").on(t.patientId).where(sql`${t.lead}`),
  ],
);

export const carerLinks = pgTable(
  "carer_links",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    carerUserId: text("carer_user_id").references(() => user.id, { onDelete: "cascade" }),
    invitedEmail: text("invited_email").notNull(),
    invitedByUserId: text("invited_by_user_id").references(() => user.id, { onDelete: "set null" }),
    inviteTokenHash: text("invite_token_hash").unique(),
    inviteExpiresAt: timestamp("invite_expires_at", { withTimezone: true }),
    status: text("status", { enum: ["pending", "active", "revoked"] }).notNull().default("pending"),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    // The carer chose to be told (by e-mail) when the patient reports an urgent or emergency problem.
    alertOnUrgent: boolean("alert_on_urgent").notNull().default(false),
    // How she is told: e-mail, a push to her phones, or a text (lib/portal/reach.ts).
    alertChannel: text("alert_channel", { enum: ["email", "push", "sms"] }).notNull().default("email"),
    ...timestamps,
  },
  (t) => [
    index("carer_links_patient_idx").on(t.patientId),
    index("carer_links_carer_idx").on(t.carerUserId, t.status),
    check("carer_links_alert_channel_ck", sql`${t.alertChannel} in ('email', 'push', 'sms')`),
  ],
);

// One-time codes a clinician gives a patient to open their portal account. Only an HMAC of the
// code is kept; a code is used once, expires, and a newer code for the same patient revokes it.
export const patientInvites = pgTable(
  "patient_invites",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    codeHash: text("code_hash").notNull().unique(),
    // When given, the patient must activate with this address.
    email: text("email"),
    createdByUserId: text("created_by_user_id").references(() => user.id, { onDelete: "set null" }),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    usedAt: timestamp("used_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("patient_invites_patient_idx").on(t.patientId),
    uniqueIndex("patient_invites_one_live_uq").on(t.patientId).where(sql`${t.usedAt} is null and ${t.revokedAt} is null`),
  ],
);

export type Patient = typeof patients.$inferSelect;
export type NewPatient = typeof patients.$inferInsert;
export type CarerLink = typeof carerLinks.$inferSelect;
export type PatientInvite = typeof patientInvites.$inferSelect;
