import "server-only";
// The staff view of what the patient or carer reported: recent check-ins, and the drinks-and-
// drainage diary of the last days with each day's totals from lib/clinical fluidBalance.
import { and, desc, eq, gte, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { checkIns, diaryEntries, user } from "@/db/schema";
import { fluidBalance, type FluidBalance } from "@/lib/clinical";
import { dayIn, lastDays, utcOffsetMinutes } from "@/lib/shared/time-zone";

export type StaffCheckIn = {
  id: string;
  /** When it was answered (on an offline phone, earlier than it reached us). */
  at: string;
  /** When it reached the server, when that was more than 5 minutes after it was answered. */
  receivedLaterAt: string | null;
  level: (typeof checkIns.$inferSelect)["level"];
  ruleIds: string[];
  answers: Record<string, unknown>;
  reportedByName: string | null;
  reportedByRole: string | null;
  reviewedAt: string | null;
};

export type DiaryDay = FluidBalance & { entries: { id: string; kind: "in" | "out"; volumeMl: number; at: string }[] };

export async function listRecentCheckIns({ patientId, limit = 20 }: { patientId: string; limit?: number }, tx: Executor = db): Promise<StaffCheckIn[]> {
  const rows = await tx
    .select({ c: checkIns, name: user.name, role: user.role })
    .from(checkIns)
    .leftJoin(user, eq(user.id, checkIns.reportedByUserId))
    .where(eq(checkIns.patientId, patientId))
    .orderBy(desc(sql`coalesce(${checkIns.answeredAt}, ${checkIns.createdAt})`), desc(checkIns.createdAt))
    .limit(limit);
  return rows.map(({ c, name, role }) => ({
    id: c.id,
    at: (c.answeredAt ?? c.createdAt).toISOString(),
    receivedLaterAt: c.answeredAt && c.createdAt.getTime() - c.answeredAt.getTime() > 5 * 60_000 ? c.createdAt.toISOString() : null,
    level: c.level,
    ruleIds: c.ruleIds,
    answers: c.answers ?? {},
    reportedByName: name,
    reportedByRole: role,
    reviewedAt: c.reviewedAt ? c.reviewedAt.toISOString() : null,
  }));
}

/** The last `days` calendar days (newest first), each with its entries and totals. */
export async function listDiaryDays({ patientId, days = 7, now = new Date() }: { patientId: string; days?: number; now?: Date }, tx: Executor = db): Promise<DiaryDay[]> {
  const since = new Date(now.getTime() - (days + 1) * 86_400_000);
  const rows = await tx
    .select({ id: diaryEntries.id, kind: diaryEntries.kind, volumeMl: diaryEntries.volumeMl, at: diaryEntries.at })
    .from(diaryEntries)
    .where(and(eq(diaryEntries.patientId, patientId), gte(diaryEntries.at, since)))
    .orderBy(desc(diaryEntries.at));
  const entries = rows.map((r) => ({ ...r, at: r.at.toISOString() }));
  return lastDays(days, undefined, now).map((day) => {
    // The zone's offset at noon of that day, so a day across a clock change is still whole.
    const offset = utcOffsetMinutes(new Date(`${day}T12:00:00Z`));
    const balance = fluidBalance(entries, day, { utcOffsetMinutes: offset });
    const own = entries.filter((e) => dayIn(new Date(e.at)) === day);
    return { ...balance, entries: own };
  });
}
