import "server-only";
// The access log of one patient's record: every audit event about the patient, newest first.
// Views of the record (any tab, the device card) by the same person the same way within 30
// minutes are one line ("viewed 12 times"), so a team paging through the tabs does not bury a
// stranger's visit; every change stays a line of its own. One query per page.
import { sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import type { auditEvents } from "@/db/schema";
import { deploymentTimeZone } from "@/lib/shared/time-zone";

export type AccessLogEntry = {
  id: number;
  /** The latest event of the line. */
  at: string;
  /** The first event of the line (the same as `at` for a single event). */
  firstAt: string;
  /** Events on this line: more than 1 only for grouped views. */
  count: number;
  action: string;
  actorName: string | null;
  actorRole: string | null;
  via: (typeof auditEvents.$inferSelect)["via"];
  reason: string | null;
  organisationName: string | null;
};

export type AccessLogFilter = "all" | "outside";
export type AccessLogPage = { entries: AccessLogEntry[]; total: number; page: number; pageSize: number; filter: AccessLogFilter; month: string | null };

/** Views run together into one line when the next comes within this many minutes. */
export const VIEW_GROUP_MINUTES = 30;

type Row = {
  id: number;
  at: Date | string;
  first_at: Date | string;
  n: number;
  action: string;
  actor_name: string | null;
  actor_role: string | null;
  via: AccessLogEntry["via"];
  reason: string | null;
  organisation_name: string | null;
  total: number;
};

export async function listAccessLog(
  {
    patientId,
    page,
    pageSize,
    filter = "all",
    month = null,
  }: { patientId: string; page: number; pageSize: number; filter?: AccessLogFilter; /** "YYYY-MM", a calendar month in the deployment's time zone. */ month?: string | null },
  tx: Executor = db,
): Promise<AccessLogPage> {
  // "outside": anyone not acting as the care team (visiting clinicians, the device card by QR or
  // code, the patient and carers, admins); the system's own work is left out.
  const outside = filter === "outside" ? sql`and (a.via is null or a.via not in ('care_team', 'system'))` : sql``;
  const zone = deploymentTimeZone();
  const inMonth = month
    ? sql`and (a.at at time zone ${zone}) >= ${`${month}-01`}::timestamp and (a.at at time zone ${zone}) < (${`${month}-01`}::timestamp + interval '1 month')`
    : sql``;
  const result = await tx.execute<Row>(sql`
    with e as (
      select a.*,
             (a.action like 'patient.view.%' or a.action = 'passport.card.view') as is_view,
             lag(a.at) over (partition by a.actor_user_id, a.via, (a.action like 'patient.view.%' or a.action = 'passport.card.view') order by a.at, a.id) as prev_at
      from audit_events a
      where a.patient_id = ${patientId} ${outside} ${inMonth}
    ),
    g as (
      select e.*,
             sum(case when e.is_view and e.prev_at is not null and e.at - e.prev_at <= ${`${VIEW_GROUP_MINUTES} minutes`}::interval then 0 else 1 end)
               over (partition by e.actor_user_id, e.via, e.is_view order by e.at, e.id) as grp
      from e
    ),
    lines as (
      select max(g.id) as id, max(g.at) as at, min(g.at) as first_at, count(*)::int as n,
             case when bool_and(g.is_view) and count(distinct g.action) > 1 then 'patient.view' else max(g.action) end as action,
             g.actor_user_id, max(g.actor_role) as actor_role, g.via, max(g.reason) as reason, max(g.organisation_id::text) as organisation_id
      from g
      group by g.actor_user_id, g.via, g.is_view, g.grp
    )
    select l.id, l.at, l.first_at, l.n, l.action, u.name as actor_name, l.actor_role, l.via, l.reason,
           -- The event's organisation, else the member of staff's organisations now (a visit
           -- access event names none): the patient asks "who, from where".
           coalesce(o.name, (select string_agg(o2.name, ', ' order by o2.name) from memberships m join organisations o2 on o2.id = m.organisation_id
                             where m.user_id = l.actor_user_id and l.actor_role in ('clinician', 'admin'))) as organisation_name,
           count(*) over ()::int as total
    from lines l
    left join "user" u on u.id = l.actor_user_id
    left join organisations o on o.id::text = l.organisation_id
    order by l.at desc, l.id desc
    limit ${pageSize} offset ${(page - 1) * pageSize}
  `);
  let total = result.rows[0]?.total ?? 0;
  if (result.rows.length === 0 && page > 1) {
    // Past the last page: count the lines on their own.
    const again = await listAccessLog({ patientId, page: 1, pageSize: 1, filter, month }, tx);
    total = again.total;
  }
  const iso = (d: Date | string) => new Date(d).toISOString();
  return {
    entries: result.rows.map((r) => ({
      id: Number(r.id),
      at: iso(r.at),
      firstAt: iso(r.first_at),
      count: Number(r.n),
      action: r.action,
      actorName: r.actor_name,
      actorRole: r.actor_role,
      via: r.via,
      reason: r.reason,
      organisationName: r.organisation_name,
    })),
    total: Number(total),
    page,
    pageSize,
    filter,
    month,
  };
}
