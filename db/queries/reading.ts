import "server-only";
import { eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { readingPreferences } from "@/db/schema";
import { DEFAULT_READING, type ReadingComfort } from "@/lib/validations/reading";

/** A person's text size and contrast; the defaults when never set. */
export async function getReadingComfort({ userId }: { userId: string }, tx: Executor = db): Promise<ReadingComfort> {
  const [row] = await tx.select({ textSize: readingPreferences.textSize, contrast: readingPreferences.contrast }).from(readingPreferences).where(eq(readingPreferences.userId, userId));
  return row ?? DEFAULT_READING;
}

export async function setReadingComfort({ userId, comfort }: { userId: string; comfort: ReadingComfort }, tx: Executor = db) {
  await tx
    .insert(readingPreferences)
    .values({ userId, ...comfort })
    .onConflictDoUpdate({ target: readingPreferences.userId, set: { ...comfort, updatedAt: new Date() } });
}
