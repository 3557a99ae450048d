// Deployment-wide settings, one row per key.
import { jsonb, pgTable, text } from "drizzle-orm/pg-core";
import { timestamps } from "./columns";

// Deployment-wide settings (emergency number, default intervals…), one row per key.
export const settings = pgTable("settings", {
  key: text("key").primaryKey(),
  value: jsonb("value").notNull(),
  ...timestamps,
});
