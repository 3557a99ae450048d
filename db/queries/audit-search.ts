import "server-only";
import { and, desc, eq, gte, ilike, inArray, lt, or, sql, type SQL } from "drizzle-orm";
import { db } from "@/db";
import { auditEvents, careTeam, memberships, organisations, patients, user } from "@/db/schema";
import type { AuditQuery } from "@/lib/validations/audit";

export type AuditRow = {
  id: number;
  at: Date;
  action: string;
  via: string | null;
  reason: string | null;
  actor: { id: string; name: string; email: string; role: string | null } | null;
  patient: { id: string; name: string; healthRecordNumber: string } | null;
  organisation: { id: string; name: string } | null;
  details: Record<string, unknown>;
};

const like = (s: string) => `%${s.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * What an admin may see: events about patients whose care team includes one of their
 * organisations, events by staff of their organisations, and events about those organisations.
 */
function scope(organisationIds: string[]): SQL {
  return or(
    inArray(auditEvents.patientId, db.select({ id: careTeam.patientId }).from(careTeam).where(inArray(careTeam.organisationId, organisationIds))),
    inArray(auditEvents.actorUserId, db.select({ id: memberships.userId }).from(memberships).where(inArray(memberships.organisationId, organisationIds))),
    inArray(auditEvents.organisationId, organisationIds),
  )!;
}

function filters(q: Omit<AuditQuery, "page" | "pageSize">): SQL[] {
  const actor = user;
  const out: SQL[] = [];
  if (q.person) out.push(or(ilike(actor.name, like(q.person)), ilike(actor.email, like(q.person)))!);
  if (q.patient) {
    out.push(
      or(
        ilike(patients.healthRecordNumber, like(q.patient)),
        ilike(sql`${patients.givenName} || ' ' || ${patients.familyName}`, like(q.patient)),
      )!,
    );
  }
  if (q.action) out.push(or(eq(auditEvents.action, q.action), ilike(auditEvents.action, `${q.action.replace(/[\\%_]/g, (c) => `\\${c}`)}.%`))!);
  if (q.via) out.push(eq(auditEvents.via, q.via));
  if (q.from) out.push(gte(auditEvents.at, new Date(`${q.from}T00:00:00Z`)));
  if (q.to) {
    const end = new Date(`${q.to}T00:00:00Z`);
    end.setUTCDate(end.getUTCDate() + 1);
    out.push(lt(auditEvents.at, end));
  }
  return out;
}

export async function searchAudit({
  organisationIds,
  query,
  limit,
  offset,
}: {
  organisationIds: string[];
  query: Omit<AuditQuery, "page" | "pageSize">;
  limit: number;
  offset: number;
}): Promise<{ rows: AuditRow[]; total: number }> {
  if (organisationIds.length === 0) return { rows: [], total: 0 };
  // The actor is the one `user` joined here.
  const actor = user;
  const where = and(scope(organisationIds), ...filters(query));
  const base = db
    .select({
      id: auditEvents.id,
      at: auditEvents.at,
      action: auditEvents.action,
      via: auditEvents.via,
      reason: auditEvents.reason,
      actorId: actor.id,
      actorName: actor.name,
      actorEmail: actor.email,
      actorRole: auditEvents.actorRole,
      patientId: patients.id,
      givenName: patients.givenName,
      familyName: patients.familyName,
      hrn: patients.healthRecordNumber,
      orgId: organisations.id,
      orgName: organisations.name,
      details: auditEvents.details,
      total: sql<number>`count(*) over ()::int`,
    })
    .from(auditEvents)
    .leftJoin(actor, eq(actor.id, auditEvents.actorUserId))
    .leftJoin(patients, eq(patients.id, auditEvents.patientId))
    .leftJoin(organisations, eq(organisations.id, auditEvents.organisationId))
    .where(where)
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(limit)
    .offset(offset);
  const rows = await base;
  let total = rows[0]?.total ?? 0;
  if (rows.length === 0 && offset > 0) {
    const [c] = await db
      .select({ n: sql<number>`count(*)::int` })
      .from(auditEvents)
      .leftJoin(actor, eq(actor.id, auditEvents.actorUserId))
      .leftJoin(patients, eq(patients.id, auditEvents.patientId))
      .where(where);
    total = c.n;
  }
  return {
    total,
    rows: rows.map((r) => ({
      id: r.id,
      at: r.at,
      action: r.action,
      via: r.via,
      reason: r.reason,
      actor: r.actorId ? { id: r.actorId, name: r.actorName!, email: r.actorEmail!, role: r.actorRole } : null,
      patient: r.patientId ? { id: r.patientId, name: `${r.givenName} ${r.familyName}`, healthRecordNumber: r.hrn! } : null,
      organisation: r.orgId ? { id: r.orgId, name: r.orgName! } : null,
      details: r.details,
    })),
  };
}
