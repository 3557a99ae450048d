import "server-only";
import { inArray } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { settings } from "@/db/schema";

export async function readSettingRows(tx: Executor = db) {
  return tx.select({ key: settings.key, value: settings.value, updatedAt: settings.updatedAt }).from(settings);
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
