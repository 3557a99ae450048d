// Caddis's own tables. Enum values match the types of lib/clinical so a row can be handed to the
// rules as it is.
import { sql } from "drizzle-orm";
import {
  bigserial,
  boolean,
  check,
  date,
  index,
  integer,
  jsonb,
  numeric,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";
import { user } from "./auth";

const timestamps = {
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true })
    .notNull()
    .defaultNow()
    .$onUpdate(() => new Date()),
};

export const organisationKinds = ["hospital_ward", "community_team", "gp_practice"] as const;
export type OrganisationKind = (typeof organisationKinds)[number];

export const organisations = pgTable(
  "organisations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    name: text("name").notNull(),
    kind: text("kind", { enum: organisationKinds }).notNull(),
    // e.g. the hospital a ward belongs to
    parentName: text("parent_name"),
    phone: text("phone"),
    outOfHoursPhone: text("out_of_hours_phone"),
    // Secure inbox for summaries (GP practices) and alerts (care teams).
    inboxEmail: text("inbox_email"),
    locale: text("locale").notNull().default("en"),
    languages: text("languages").array().notNull().default(sql`'{en}'::text[]`),
    requireTwoFactor: boolean("require_two_factor").notNull().default(false),
    ...timestamps,
  },
  (t) => [uniqueIndex("organisations_name_kind_uq").on(t.name, t.kind), index("organisations_kind_idx").on(t.kind)],
);

export const memberships = pgTable(
  "memberships",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    organisationId: uuid("organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("memberships_user_org_uq").on(t.userId, t.organisationId),
    index("memberships_org_idx").on(t.organisationId),
  ],
);

export const staffRoles = ["admin", "clinician"] as const;
export type StaffRole = (typeof staffRoles)[number];

// An admin's invitation to a new member of staff: a time-limited link whose token is kept only as
// its SHA-256. The account is made when the invitee accepts and sets a password.
export const staffInvitations = pgTable(
  "staff_invitations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    email: text("email").notNull(),
    name: text("name"),
    role: text("role", { enum: staffRoles }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    invitedByUserId: text("invited_by_user_id").references(() => user.id, { onDelete: "set null" }),
    acceptedAt: timestamp("accepted_at", { withTimezone: true }),
    acceptedUserId: text("accepted_user_id").references(() => user.id, { onDelete: "set null" }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("staff_invitations_email_idx").on(sql`lower(${t.email})`),
    // One open invitation per address.
    uniqueIndex("staff_invitations_one_open_uq")
      .on(sql`lower(${t.email})`)
      .where(sql`${t.acceptedAt} is null and ${t.revokedAt} is null`),
    check("staff_invitations_expiry_ck", sql`${t.expiresAt} > ${t.createdAt}`),
  ],
);

export const staffInvitationOrganisations = pgTable(
  "staff_invitation_organisations",
  {
    invitationId: uuid("invitation_id")
      .notNull()
      .references(() => staffInvitations.id, { onDelete: "cascade" }),
    organisationId: uuid("organisation_id")
      .notNull()
      .references(() => organisations.id, { onDelete: "cascade" }),
  },
  (t) => [
    primaryKey({ columns: [t.invitationId, t.organisationId] }),
    index("staff_invitation_orgs_org_idx").on(t.organisationId),
  ],
);

export const sexes = ["female", "male", "other", "unknown"] as const;

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
    sex: text("sex", { enum: sexes }).notNull(),
    preferredLocale: text("preferred_locale").notNull().default("en"),
    weightKg: numeric("weight_kg", { precision: 5, scale: 1, mode: "number" }),
    phone: text("phone"),
    allergyLatex: boolean("allergy_latex").notNull().default(false),
    allergyChlorhexidine: boolean("allergy_chlorhexidine").notNull().default(false),
    allergyLidocaine: boolean("allergy_lidocaine").notNull().default(false),
    allergyOther: text("allergy_other"),
    gpPracticeId: uuid("gp_practice_id").references(() => organisations.id, { onDelete: "set null" }),
    // Set by the care team; when present the portal gives no drink-more advice.
    fluidLimitMl: integer("fluid_limit_ml"),
    // Latest check-in level, kept here so the caseload needs no per-row lookup.
    latestCheckInLevel: text("latest_check_in_level", { enum: ["emergency", "urgent", "soon", "self-care"] }),
    latestCheckInAt: timestamp("latest_check_in_at", { withTimezone: true }),
    closedAt: timestamp("closed_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("patients_hrn_uq").on(t.healthRecordNumber),
    index("patients_family_name_idx").on(sql`lower(${t.familyName})`),
    index("patients_gp_idx").on(t.gpPracticeId),
    check("patients_weight_ck", sql`${t.weightKg} is null or (${t.weightKg} > 0 and ${t.weightKg} < 500)`),
    check("patients_fluid_limit_ck", sql`${t.fluidLimitMl} is null or ${t.fluidLimitMl} > 0`),
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
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.patientId, t.organisationId] }), index("care_team_org_idx").on(t.organisationId, t.patientId)],
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
    ...timestamps,
  },
  (t) => [index("carer_links_patient_idx").on(t.patientId), index("carer_links_carer_idx").on(t.carerUserId, t.status)],
);

export const routes = ["urethral", "suprapubic"] as const;
export const catheterTypes = ["two-way", "three-way"] as const;
export const materials = [
  "all-silicone",
  "hydrogel-coated-silicone",
  "hydrogel-coated-latex",
  "silicone-coated-latex",
  "ptfe-coated-latex",
  "latex",
] as const;
export const lengthCategories = ["standard", "female", "paediatric"] as const;
export const gelKinds = ["none", "plain", "lidocaine", "chlorhexidine", "lidocaine-chlorhexidine"] as const;

export const catheterEpisodes = pgTable(
  "catheter_episodes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    organisationId: uuid("organisation_id").references(() => organisations.id, { onDelete: "set null" }),
    previousEpisodeId: uuid("previous_episode_id"),
    route: text("route", { enum: routes }).notNull(),
    catheterType: text("catheter_type", { enum: catheterTypes }).notNull(),
    material: text("material", { enum: materials }).notNull(),
    lengthCategory: text("length_category", { enum: lengthCategories }).notNull(),
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
    gelKind: text("gel_kind", { enum: gelKinds }).notNull().default("none"),
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
    removedAt: timestamp("removed_at", { withTimezone: true }),
    removalReason: text("removal_reason"),
    ...timestamps,
  },
  (t) => [
    index("episodes_patient_idx").on(t.patientId, t.insertedAt),
    // At most one catheter in place per patient.
    uniqueIndex("episodes_one_active_uq").on(t.patientId).where(sql`${t.removedAt} is null`),
    index("episodes_active_change_idx").on(t.plannedChangeOn).where(sql`${t.removedAt} is null`),
    index("episodes_active_review_idx").on(t.reviewDueOn).where(sql`${t.removedAt} is null`),
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

export const eventKinds = [
  "insertion",
  "planned_change",
  "unplanned_change",
  "problem",
  "removal",
  "twoc_outcome",
  "visit",
  "review",
] as const;
export const unplannedReasons = ["blockage", "bypassing", "expelled", "infection", "other"] as const;

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
    kind: text("kind", { enum: eventKinds }).notNull(),
    reason: text("reason", { enum: unplannedReasons }),
    twocOutcome: text("twoc_outcome", { enum: ["passed", "failed"] }),
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

export const passports = pgTable(
  "passports",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    // SHA-256 of the QR token and of the short code; the plain values are never stored.
    tokenHash: text("token_hash").notNull().unique(),
    shortCodeHash: text("short_code_hash").notNull().unique(),
    languages: text("languages").array().notNull(),
    issuedByUserId: text("issued_by_user_id").references(() => user.id, { onDelete: "set null" }),
    issuedAt: timestamp("issued_at", { withTimezone: true }).notNull().defaultNow(),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("passports_patient_idx").on(t.patientId),
    uniqueIndex("passports_one_current_uq").on(t.patientId).where(sql`${t.revokedAt} is null`),
  ],
);

export const checkInLevels = ["emergency", "urgent", "soon", "self-care"] as const;

export const checkIns = pgTable(
  "check_ins",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    reportedByUserId: text("reported_by_user_id").references(() => user.id, { onDelete: "set null" }),
    answers: jsonb("answers").$type<Record<string, unknown>>().notNull(),
    level: text("level", { enum: checkInLevels }).notNull(),
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

export const outboundStatuses = ["queued", "sending", "sent", "failed"] as const;
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
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    html: text("html").notNull(),
    text: text("text").notNull(),
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
  ],
);

export const supplyItemKinds = ["catheter", "leg-bag", "night-bag", "valve", "gel"] as const;
export type SupplyRequestItem = {
  item: (typeof supplyItemKinds)[number];
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

export const auditVia = ["care_team", "visit_access", "qr", "self", "carer", "admin", "system"] as const;

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

// Deployment-wide settings (emergency number, default intervals…), one row per key.
export const settings = pgTable("settings", {
  key: text("key").primaryKey(),
  value: jsonb("value").notNull(),
  ...timestamps,
});

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

export const bagKinds = ["leg-bag", "valve"] as const;

// "I changed my leg bag / valve today", logged by the patient or carer; the next change is
// worked out by lib/clinical nextBagChange from the latest row of each kind.
export const bagChanges = pgTable(
  "bag_changes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id")
      .notNull()
      .references(() => patients.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: bagKinds }).notNull(),
    changedOn: date("changed_on").notNull(),
    recordedByUserId: text("recorded_by_user_id").references(() => user.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [index("bag_changes_patient_idx").on(t.patientId, t.kind, t.changedOn)],
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

// NEWS2 observations taken on a visit (RCP NEWS2 2017). The values as entered, and the score
// lib/clinical scoreNews2 gave on the server when they were saved (never recomputed on read).
export const consciousnessLevels = ["A", "C", "V", "P", "U"] as const;
export const news2Risks = ["low", "low-medium", "medium", "high"] as const;
export const news2ResponseKeys = ["routine", "ward-assessment", "urgent-ward-review", "urgent", "emergency"] as const;

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
    consciousness: text("consciousness", { enum: consciousnessLevels }).notNull(),
    temperatureC: numeric("temperature_c", { precision: 3, scale: 1, mode: "number" }).notNull(),
    news2Total: integer("news2_total").notNull(),
    news2Subscores: jsonb("news2_subscores").$type<Record<string, number>>().notNull(),
    news2Risk: text("news2_risk", { enum: news2Risks }).notNull(),
    news2Response: text("news2_response", { enum: news2ResponseKeys }).notNull(),
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

export type Organisation = typeof organisations.$inferSelect;
export type NewOrganisation = typeof organisations.$inferInsert;
export type Membership = typeof memberships.$inferSelect;
export type StaffInvitation = typeof staffInvitations.$inferSelect;
export type Patient = typeof patients.$inferSelect;
export type NewPatient = typeof patients.$inferInsert;
export type CarerLink = typeof carerLinks.$inferSelect;
export type CatheterEpisode = typeof catheterEpisodes.$inferSelect;
export type NewCatheterEpisode = typeof catheterEpisodes.$inferInsert;
export type EpisodeEvent = typeof episodeEvents.$inferSelect;
export type NewEpisodeEvent = typeof episodeEvents.$inferInsert;
export type Passport = typeof passports.$inferSelect;
export type CheckIn = typeof checkIns.$inferSelect;
export type DiaryEntry = typeof diaryEntries.$inferSelect;
export type Upload = typeof uploads.$inferSelect;
export type OutboundMessage = typeof outboundMessages.$inferSelect;
export type NewOutboundMessage = typeof outboundMessages.$inferInsert;
export type SupplyRequest = typeof supplyRequests.$inferSelect;
export type NewSupplyRequest = typeof supplyRequests.$inferInsert;
export type AuditEvent = typeof auditEvents.$inferSelect;
export type NewAuditEvent = typeof auditEvents.$inferInsert;
export type VisitAccess = typeof visitAccess.$inferSelect;
export type PatientInvite = typeof patientInvites.$inferSelect;
export type BagChange = typeof bagChanges.$inferSelect;
export type Observation = typeof observations.$inferSelect;
export type NewObservation = typeof observations.$inferInsert;
