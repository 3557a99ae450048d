import "server-only";
import { inArray, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { settings } from "@/db/schema";

/**
 * Read as JSON text and parsed here: drizzle re-parses a jsonb string that looks like a number
 * ("999" would come back as 999).
 */
export async function readSettingRows(tx: Executor = db) {
  const rows = await tx.select({ key: settings.key, json: sql<string>`${settings.value}::text`, updatedAt: settings.updatedAt }).from(settings);
  return rows.map((r) => ({ key: r.key, value: JSON.parse(r.json) as unknown, updatedAt: r.updatedAt }));
}

/** Sets the given keys; a null value removes the key (the setting is then not configured). */
export async function writeSettings({ values }: { values: Record<string, unknown> }, tx: Executor = db) {
  const clear = Object.entries(values).filter(([, v]) => v === null).map(([k]) => k);
  const set = Object.entries(values).filter(([, v]) => v !== null && v !== undefined);
  if (clear.length) await tx.delete(settings).where(inArray(settings.key, clear));
  for (const [key, value] of set) {
    await tx
      .insert(settings)
      .values({ key, value })
      .onConflictDoUpdate({ target: settings.key, set: { value, updatedAt: new Date() } });
  }
}
