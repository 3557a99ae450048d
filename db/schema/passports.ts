// Issued passports: the revocable device-card token (hash only).
import { sql } from "drizzle-orm";
import { index, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { user } from "./auth";
import { timestamps } from "./columns";
import { patients } from "./patients";

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

export type Passport = typeof passports.$inferSelect;
