import "server-only";
// The access log of one patient's record: every audit event about the patient, newest first.
// One query per page (the total comes with it through a window function).
import { and, desc, eq, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { auditEvents, organisations, user } from "@/db/schema";

export type AccessLogEntry = {
  id: number;
  at: string;
  action: string;
  actorName: string | null;
  actorRole: string | null;
  via: (typeof auditEvents.$inferSelect)["via"];
  reason: string | null;
  organisationName: string | null;
};

export type AccessLogPage = { entries: AccessLogEntry[]; total: number; page: number; pageSize: number };

export async function listAccessLog(
  { patientId, page, pageSize }: { patientId: string; page: number; pageSize: number },
  tx: Executor = db,
): Promise<AccessLogPage> {
  const rows = await tx
    .select({
      id: auditEvents.id,
      at: auditEvents.at,
      action: auditEvents.action,
      actorName: user.name,
      actorRole: auditEvents.actorRole,
      via: auditEvents.via,
      reason: auditEvents.reason,
      organisationName: organisations.name,
      total: sql<number>`count(*) over()`.mapWith(Number),
    })
    .from(auditEvents)
    .leftJoin(user, eq(user.id, auditEvents.actorUserId))
    .leftJoin(organisations, eq(organisations.id, auditEvents.organisationId))
    .where(and(eq(auditEvents.patientId, patientId)))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(pageSize)
    .offset((page - 1) * pageSize);
  let total = rows[0]?.total ?? 0;
  if (rows.length === 0 && page > 1) {
    // Past the last page: the window count has no row to ride on, so count on its own.
    const [c] = await tx.select({ n: sql<number>`count(*)`.mapWith(Number) }).from(auditEvents).where(eq(auditEvents.patientId, patientId));
    total = c?.n ?? 0;
  }
  return {
    entries: rows.map(({ total: _t, at, ...r }) => ({ ...r, at: at.toISOString() })),
    total,
    page,
    pageSize,
  };
}
