import "server-only";
import { and, asc, eq, getTableColumns, gte, lt } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { diaryEntries, user, type DiaryEntry } from "@/db/schema";

export type DiaryEntryDto = {
  id: string;
  kind: "in" | "out";
  volumeMl: number;
  at: string;
  /** The phone's key for it, so the phone can match a sent entry with the one it queued. */
  clientKey: string | null;
  /** Added by the viewer and still within the time it may be removed. */
  removable: boolean;
  /** Who added it: the viewer, else that person's name (null once their account is gone). */
  byYou: boolean;
  byName: string | null;
};

/** `removable`: whether this viewer may still remove it (lib/auth/permissions canRemoveDiaryEntry). */
export function toDiaryDto(row: DiaryEntry & { recorderName?: string | null }, removable: boolean, viewerUserId: string): DiaryEntryDto {
  const byYou = row.recordedByUserId === viewerUserId;
  return { id: row.id, kind: row.kind, volumeMl: row.volumeMl, at: row.at.toISOString(), clientKey: row.clientKey, removable, byYou, byName: byYou ? null : (row.recorderName ?? null) };
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

/** The entries in a time range, with the name of whoever added each. */
export async function listDiaryEntries({ patientId, from, to }: { patientId: string; from: Date; to: Date }, tx: Executor = db) {
  return tx
    .select({ ...getTableColumns(diaryEntries), recorderName: user.name })
    .from(diaryEntries)
    .leftJoin(user, eq(user.id, diaryEntries.recordedByUserId))
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
