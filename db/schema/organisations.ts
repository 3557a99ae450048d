// Organisations (wards, community teams, GP practices), staff memberships and staff invitations.
import { sql } from "drizzle-orm";
import { boolean, check, index, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";

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
    // Staff sign in with a second step (TOTP) unless an admin relaxed it for this organisation,
    // with a reason on record (ASVS 5.0.0 6.3.3). A member of staff of several organisations
    // needs it if any of them requires it; one of none needs it too.
    requireTwoFactor: boolean("require_two_factor").notNull().default(true),
    twoFactorRelaxedReason: text("two_factor_relaxed_reason"),
    twoFactorRelaxedByUserId: text("two_factor_relaxed_by_user_id").references(() => user.id, { onDelete: "set null" }),
    twoFactorRelaxedAt: timestamp("two_factor_relaxed_at", { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("organisations_name_kind_uq").on(t.name, t.kind),
    index("organisations_kind_idx").on(t.kind),
    check(
      "organisations_two_factor_reason_ck",
      sql`${t.requireTwoFactor} or (length(trim(coalesce(${t.twoFactorRelaxedReason}, ''))) >= 10 and ${t.twoFactorRelaxedAt} is not null)`,
    ),
  ],
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

export type Organisation = typeof organisations.$inferSelect;
export type NewOrganisation = typeof organisations.$inferInsert;
export type Membership = typeof memberships.$inferSelect;
export type StaffInvitation = typeof staffInvitations.$inferSelect;
