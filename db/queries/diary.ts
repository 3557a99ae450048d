import "server-only";
import { and, asc, eq, gte, lt } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { diaryEntries, type DiaryEntry } from "@/db/schema";
import { DIARY_DELETE_HOURS } from "@/lib/validations/diary";

export type DiaryEntryDto = {
  id: string;
  kind: "in" | "out";
  volumeMl: number;
  at: string;
  /** The phone's key for it, so the phone can match a sent entry with the one it queued. */
  clientKey: string | null;
  /** Added by the viewer and still within the time it may be removed. */
  removable: boolean;
};

export function canRemove(row: Pick<DiaryEntry, "recordedByUserId" | "createdAt">, userId: string, now = Date.now()) {
  return row.recordedByUserId === userId && now - row.createdAt.getTime() <= DIARY_DELETE_HOURS * 3_600_000;
}

export function toDiaryDto(row: DiaryEntry, userId: string): DiaryEntryDto {
  return { id: row.id, kind: row.kind, volumeMl: row.volumeMl, at: row.at.toISOString(), clientKey: row.clientKey, removable: canRemove(row, userId) };
}

/** Adds the entry; with a client key already used, adds nothing and answers null. */
export async function addDiaryEntry(
  values: { patientId: string; kind: "in" | "out"; volumeMl: number; at: Date; recordedByUserId: string; clientKey?: string },
  tx: Executor = db,
) {
  const [row] = await tx.insert(diaryEntries).values(values).onConflictDoNothing({ target: diaryEntries.clientKey }).returning();
  return row ?? null;
}

export async function getDiaryEntryByClientKey({ clientKey }: { clientKey: string }, tx: Executor = db) {
  const [row] = await tx.select().from(diaryEntries).where(eq(diaryEntries.clientKey, clientKey));
  return row ?? null;
}

export async function listDiaryEntries({ patientId, from, to }: { patientId: string; from: Date; to: Date }, tx: Executor = db) {
  return tx
    .select()
    .from(diaryEntries)
    .where(and(eq(diaryEntries.patientId, patientId), gte(diaryEntries.at, from), lt(diaryEntries.at, to)))
    .orderBy(asc(diaryEntries.at));
}

export async function getDiaryEntry({ id }: { id: string }, tx: Executor = db) {
  const [row] = await tx.select().from(diaryEntries).where(eq(diaryEntries.id, id));
  return row ?? null;
}

export async function deleteDiaryEntry({ id }: { id: string }, tx: Executor = db) {
  await tx.delete(diaryEntries).where(eq(diaryEntries.id, id));
}
