import "server-only";
// How the portal reaches a person: mobile number and consent to texts, quiet hours, reminders.
import { eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { reachSettings, type ReminderChoice } from "@/db/schema";

export type ReachDto = {
  phone: string;
  smsConsent: boolean;
  quietStart: string;
  quietEnd: string;
  reminders: Partial<Record<string, ReminderChoice>>;
};

export const DEFAULT_REACH: ReachDto = { phone: "", smsConsent: false, quietStart: "22:00", quietEnd: "07:00", reminders: {} };

export async function getReach({ userId }: { userId: string }, tx: Executor = db): Promise<ReachDto> {
  const [row] = await tx.select().from(reachSettings).where(eq(reachSettings.userId, userId));
  if (!row) return DEFAULT_REACH;
  return { phone: row.phone ?? "", smsConsent: row.smsConsentAt !== null, quietStart: row.quietStart, quietEnd: row.quietEnd, reminders: row.reminders };
}

/** Saves the choices; the consent keeps its first date while it stays given. */
export async function setReach({ userId, reach }: { userId: string; reach: ReachDto }, tx: Executor = db) {
  const values = {
    phone: reach.phone || null,
    quietStart: reach.quietStart,
    quietEnd: reach.quietEnd,
    reminders: reach.reminders,
  };
  const [existing] = await tx.select({ smsConsentAt: reachSettings.smsConsentAt }).from(reachSettings).where(eq(reachSettings.userId, userId));
  const smsConsentAt = reach.smsConsent ? (existing?.smsConsentAt ?? new Date()) : null;
  await tx
    .insert(reachSettings)
    .values({ userId, ...values, smsConsentAt })
    .onConflictDoUpdate({ target: reachSettings.userId, set: { ...values, smsConsentAt, updatedAt: new Date() } });
}
