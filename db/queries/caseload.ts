import "server-only";
// The caseload: patients whose care team includes one of the viewer's organisations, with the
// catheter in place. At most two SQL statements per page — each gives its part's total and page
// rows — whatever the page size (tests/integration/caseload-scale.test.ts counts the queries).
// Built to stay quick at 100,000 patients in one team (docs/performance.md has the plan): the
// care-team check is a per-row index lookup, not a hash of the whole team; the page walks the
// sort column's index and stops after its rows; and the total is counted exactly up to
// COUNT_CAP rows past the page, beyond which the page says "more than".
//
// Sorted by a catheter's date (next change, review, days since insertion), every patient with a
// catheter in place comes before every patient without one (their date is null: "nulls last").
// So the view is read in two parts, each in its own index's order: patients with a catheter,
// walked from the catheter's date index, then — only when the page or the count runs past them —
// patients without one. Sorted by name, or searching, the view is one walk of the patients.
import { sql, type SQL } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { parseIsoDate, stateFor, trialClock, TWOC_DEFAULTS, worseState, type CaseloadState } from "@/lib/clinical";
import { deploymentTimeZone, todayIso } from "@/lib/shared/time-zone";
import type { CaseloadFilter, CaseloadQuery, CaseloadSort, CaseloadView } from "@/lib/validations/caseload";
import type { Route, TriageLevel } from "@/lib/clinical";

export type CheckInLevel = TriageLevel;

export type CaseloadRow = {
  patientId: string;
  name: string;
  givenName: string;
  familyName: string;
  healthRecordNumber: string;
  route: Route | null;
  sizeCh: number | null;
  /** Calendar day of insertion in the deployment's time zone. */
  insertedOn: string | null;
  daysSinceInsertion: number | null;
  plannedChangeOn: string | null;
  reviewDueOn: string | null;
  changeState: CaseloadState | null;
  reviewState: CaseloadState | null;
  /** Worst of change and review (lib/clinical planDates' rule); null with no catheter in place. */
  state: CaseloadState | null;
  latestCheckInLevel: CheckInLevel | null;
  latestCheckInAt: string | null;
  awaitingTwoc: boolean;
  /** The catheter came out for a trial without catheter at this time and no outcome is recorded yet. */
  trialRemovedAt: string | null;
  /** When the patient is expected to have passed urine (the deployment's window), and whether it passed. */
  trialVoidBy: string | null;
  trialOverdue: boolean;
  /** The trial planned for the catheter in place (day and any medicine given before it). */
  twocPlannedOn: string | null;
  twocMedicineNote: string | null;
  /**
   * Discharged from the catheter caseload after a passed trial: shown only under the
   * "follow-up" filter, with the follow-up review day as its review date.
   */
  followUp: boolean;
};

/** `totalIsAtLeast`: the view holds more than `total` patients (counting stopped there). */
export type CaseloadPage = { rows: CaseloadRow[]; total: number; totalIsAtLeast: boolean; page: number; pageSize: number; today: string; dueSoonDays: number };

/** Rows counted beyond the current page before the total is given as "more than". */
export const COUNT_CAP = 1000;

type RawRow = {
  total: number;
  patient_id: string | null;
  given_name: string;
  family_name: string;
  health_record_number: string;
  latest_check_in_level: CheckInLevel | null;
  latest_check_in_at: string | null;
  route: Route | null;
  size_ch: number | null;
  inserted_on: string | null;
  planned_change_on: string | null;
  review_due_on: string | null;
  awaiting_twoc: boolean | null;
  trial_removed_at: string | null;
  twoc_planned_on: string | null;
  twoc_medicine_note: string | null;
  discharged: boolean | null;
  follow_up_review_on: string | null;
};

// The text a search looks in, as patients_search_trgm_idx indexes it (a line break between the
// parts, so a search cannot match across two of them).
const searchText = sql`lower(f.given_name || ' ' || f.family_name || E'\\n' || f.family_name || ' ' || f.given_name || E'\\n' || f.health_record_number)`;

// Escapes LIKE wildcards so a search for "50%" or "A_B" means those characters.
function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/**
 * Which patients a statement reads: the whole view in one walk (sorted by name, or searching), or
 * one of its two parts (sorted by a catheter's date, the parts follow each other).
 */
export type CaseloadPart = "whole" | "with-catheter" | "without-catheter";

/** The statements a view needs, in the order their rows come. */
export function caseloadParts(view: CaseloadView): CaseloadPart[] {
  if (view.q || view.sort === "name") return ["whole"];
  // A date filter needs a date, so only patients with a catheter; follow-up only those without.
  if (view.filter === "overdue" || view.filter === "due-soon") return ["with-catheter"];
  if (view.filter === "follow-up") return ["without-catheter"];
  return ["with-catheter", "without-catheter"];
}

function filterCondition(filter: CaseloadFilter | undefined, today: string, dueSoonDays: number, searching: boolean, part: CaseloadPart): SQL {
  // A patient discharged from the catheter caseload (after a passed trial, no catheter back in)
  // shows only under "follow-up" while a review is to come, until a catheter goes in again; once
  // the follow-up has ended, only a search by name or number finds them.
  if (filter === "follow-up") return sql`and f.catheter_discharged_at is not null and f.episode_id is null and f.follow_up_review_on is not null`;
  if (!filter && searching) return sql``;
  return sql`and (f.catheter_discharged_at is null or f.episode_id is not null) ${dateFilter(filter, today, dueSoonDays)}
    ${filter === "twoc" ? trialCandidates[part] : sql``}`;
}

// Who can pass the trial filter, said as a join the planner can start from (the trial's two
// partial indexes), so it need not walk every patient: a catheter in place awaiting or planned
// for a trial, or one out for a trial with no outcome yet. Implied by the filter, never wider.
const trialCandidates: Record<CaseloadPart, SQL> = {
  "with-catheter": sql``,
  "without-catheter": sql`and exists (select 1 from catheter_episodes t where t.patient_id = f.patient_id and t.awaiting_twoc and t.removed_at is not null)`,
  whole: sql`and f.patient_id in (select t.patient_id from catheter_episodes t
    where (t.removed_at is null and (t.awaiting_twoc or t.twoc_planned_on is not null)) or (t.awaiting_twoc and t.removed_at is not null))`,
};

function dateFilter(filter: CaseloadFilter | undefined, today: string, dueSoonDays: number): SQL {
  // The states compare the stored planDates dates with today, as stateFor does: overdue once a
  // date has passed; due soon from today to today + dueSoonDays (either date).
  switch (filter) {
    case "overdue":
      return sql`and (f.planned_change_on < ${today}::date or f.review_due_on < ${today}::date)`;
    case "due-soon":
      return sql`and (f.planned_change_on between ${today}::date and ${today}::date + ${dueSoonDays}::int
        or f.review_due_on between ${today}::date and ${today}::date + ${dueSoonDays}::int)`;
    case "urgent":
      return sql`and f.latest_check_in_level in ('urgent', 'emergency')`;
    case "twoc":
      // Awaiting a trial: planned (a day set or the catheter marked for one), or under way (the
      // catheter is out for the trial and no outcome is recorded).
      return sql`and (f.awaiting_twoc or f.twoc_planned_on is not null or f.trial_removed_at is not null)`;
    default:
      return sql``;
  }
}

function orderBy(sort: CaseloadSort, dir: "asc" | "desc", part: CaseloadPart): SQL {
  const d = dir === "desc" ? sql`desc` : sql`asc`;
  // Name as the tie-break, then the id, so pages never overlap or skip a row.
  const names = sql`lower(f.family_name) ${d}, lower(f.given_name) ${d}, f.patient_id`;
  // Without a catheter every date is null: the names alone. With one, no date is null (the
  // columns are not null), so "nulls last" is left out and a backward index scan serves "desc".
  if (sort === "name" || part === "without-catheter") return sql`order by ${names}`;
  const nulls = part === "whole" ? sql`nulls last` : sql``;
  switch (sort) {
    case "review":
      return sql`order by f.review_due_on ${d} ${nulls}, ${names}`;
    case "days-inserted":
      // More days since insertion = an earlier insertion.
      return sql`order by f.inserted_at ${dir === "desc" ? sql`asc` : sql`desc`} ${nulls}, ${names}`;
    case "next-change":
    default:
      return sql`order by f.planned_change_on ${d} ${nulls}, ${names}`;
  }
}

const patientColumns = sql`p.id as patient_id, p.given_name, p.family_name, p.health_record_number,
  p.latest_check_in_level, p.latest_check_in_at, p.catheter_discharged_at, p.follow_up_review_on`;
const episodeColumns = sql`e.id as episode_id, e.route, e.size_ch, e.inserted_at, e.planned_change_on, e.review_due_on,
  e.awaiting_twoc, e.twoc_planned_on, e.twoc_medicine_note`;

/** The patients of a part, before filter and order: one row each, care team checked per row. */
function partRows(part: CaseloadPart, orgs: SQL): SQL {
  const inTeam = sql`(select true from care_team ct where ct.patient_id = p.id and ct.organisation_id = any(${orgs}) limit 1)`;
  // When the last catheter came out for a trial that has no outcome yet.
  const trial = (onlyWithout: SQL) => sql`left join lateral (
        select t.removed_at from catheter_episodes t
        where t.patient_id = p.id and t.awaiting_twoc and t.removed_at is not null ${onlyWithout}
        order by t.removed_at desc limit 1
      ) tr on true`;
  switch (part) {
    case "with-catheter":
      return sql`select ${patientColumns}, ${episodeColumns}, null::timestamptz as trial_removed_at
      from catheter_episodes e
      join patients p on p.id = e.patient_id
      where e.removed_at is null and p.closed_at is null and ${inTeam}`;
    case "without-catheter":
      return sql`select ${patientColumns}, null::uuid as episode_id, null::text as route, null::int as size_ch,
             null::timestamptz as inserted_at, null::date as planned_change_on, null::date as review_due_on,
             null::boolean as awaiting_twoc, null::date as twoc_planned_on, null::text as twoc_medicine_note,
             tr.removed_at as trial_removed_at
      from patients p
      ${trial(sql``)}
      where p.closed_at is null and ${inTeam}
        and not exists (select 1 from catheter_episodes e where e.patient_id = p.id and e.removed_at is null)`;
    case "whole":
    default:
      return sql`select ${patientColumns}, ${episodeColumns}, tr.removed_at as trial_removed_at
      from patients p
      left join catheter_episodes e on e.patient_id = p.id and e.removed_at is null
      ${trial(sql`and e.id is null`)}
      where p.closed_at is null and ${inTeam}`;
  }
}

export function caseloadStatement({
  part,
  organisationIds,
  view,
  today,
  dueSoonDays,
  timeZone,
  limit,
  offset,
  countCap,
}: {
  part: CaseloadPart;
  organisationIds: string[];
  view: CaseloadView;
  today: string;
  dueSoonDays: number;
  timeZone: string;
  limit: number | null;
  offset: number;
  /** Count at most this many rows (null: count them all). */
  countCap: number | null;
}): SQL {
  const orgs = sql`array[${sql.join(
    organisationIds.map((id) => sql`${id}`),
    sql`, `,
  )}]::uuid[]`;
  // Either name order or the record number, case-insensitive: one expression, the one
  // patients_search_trgm_idx holds (a trigram index serves "contains" at 100,000 patients).
  const search = view.q ? sql`and ${searchText} like lower(${likePattern(view.q)})` : sql``;
  // Not materialised, so the count and the page each walk the view with their own limit; but a
  // search is read once (it scans what its index cannot narrow, e.g. two letters) and is small.
  return sql`
    with f as not materialized (${partRows(part, orgs)}),
    filtered as ${view.q ? sql`materialized` : sql`not materialized`} (
      select f.* from f where true ${search} ${filterCondition(view.filter, today, dueSoonDays, Boolean(view.q), part)}
    )
    select (select count(*)::int from (select 1 from filtered ${countCap === null ? sql`` : sql`limit ${countCap}`}) c) as total, pg.*
    from (select 1) one
    left join lateral (
      select f.patient_id, f.given_name, f.family_name, f.health_record_number,
             f.latest_check_in_level,
             to_char(f.latest_check_in_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as latest_check_in_at,
             f.route, f.size_ch,
             ((f.inserted_at at time zone ${timeZone})::date)::text as inserted_on,
             f.planned_change_on::text as planned_change_on,
             f.review_due_on::text as review_due_on,
             f.awaiting_twoc,
             f.twoc_planned_on::text as twoc_planned_on, f.twoc_medicine_note,
             (f.catheter_discharged_at is not null and f.episode_id is null) as discharged,
             f.follow_up_review_on::text as follow_up_review_on,
             to_char(f.trial_removed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as trial_removed_at
      from filtered f
      ${orderBy(view.sort, view.dir, part)}
      ${limit === null ? sql`` : sql`limit ${limit}`} offset ${offset}
    ) pg on true`;
}

type TrialWindow = { hours: number; now: Date };

function toRow(r: RawRow, today: string, dueSoonDays: number, window: TrialWindow): CaseloadRow {
  const clock = r.trial_removed_at ? trialClock(new Date(r.trial_removed_at), window.now, window.hours) : null;
  const todayDay = parseIsoDate("today", today);
  const dateState = (d: string | null) => (d ? stateFor(parseIsoDate("date", d) - todayDay, dueSoonDays) : null);
  const followUp = Boolean(r.discharged);
  const reviewDueOn = followUp ? r.follow_up_review_on : r.review_due_on;
  const changeState = dateState(r.planned_change_on);
  const reviewState = dateState(reviewDueOn);
  return {
    patientId: r.patient_id!,
    name: `${r.given_name} ${r.family_name}`,
    givenName: r.given_name,
    familyName: r.family_name,
    healthRecordNumber: r.health_record_number,
    route: r.route,
    sizeCh: r.size_ch,
    insertedOn: r.inserted_on,
    daysSinceInsertion: r.inserted_on ? todayDay - parseIsoDate("insertedOn", r.inserted_on) : null,
    plannedChangeOn: r.planned_change_on,
    reviewDueOn,
    changeState,
    reviewState,
    state: changeState && reviewState ? worseState(changeState, reviewState) : (changeState ?? reviewState),
    latestCheckInLevel: r.latest_check_in_level,
    latestCheckInAt: r.latest_check_in_at,
    awaitingTwoc: Boolean(r.awaiting_twoc),
    trialRemovedAt: r.trial_removed_at,
    trialVoidBy: clock ? clock.voidBy.toISOString() : null,
    trialOverdue: clock?.overdue ?? false,
    twocPlannedOn: r.twoc_planned_on,
    twocMedicineNote: r.twoc_medicine_note,
    followUp,
  };
}

type ViewArgs = { organisationIds: string[]; view: CaseloadView; today: string; dueSoonDays: number; window: TrialWindow };

/**
 * Rows `offset` to `offset + limit` of the view, and its total counted up to `countCap` (null:
 * all). Reads the view's parts in order, each only when the rows or the count reach it: at most
 * one statement per part.
 */
async function readView({ organisationIds, view, today, dueSoonDays, window }: ViewArgs, limit: number, offset: number, countCap: number | null, tx: Executor) {
  const rows: CaseloadRow[] = [];
  let counted = 0;
  let skip = offset;
  for (const part of caseloadParts(view)) {
    const left = countCap === null ? null : countCap - counted;
    const statement = caseloadStatement({ part, organisationIds, view, today, dueSoonDays, timeZone: deploymentTimeZone(), limit: limit - rows.length, offset: skip, countCap: left });
    const result = await tx.execute<RawRow>(statement);
    const partTotal = result.rows[0]?.total ?? 0;
    for (const r of result.rows) if (r.patient_id !== null) rows.push(toRow(r, today, dueSoonDays, window));
    counted += partTotal;
    // Counting stopped at the cap: this part alone holds the page and more; the next cannot show.
    if (left !== null && partTotal >= left) return { rows, total: countCap! - 1, totalIsAtLeast: true };
    skip = Math.max(0, skip - partTotal);
  }
  return { rows, total: counted, totalIsAtLeast: false };
}

/**
 * One page of the caseload, with the total of the filtered set (exact up to `countCap` past the
 * page). One statement, or two when the view has two parts and the page or the count reaches the
 * second. `dueSoonDays` is the deployment's window (lib/config/settings getPlanDefaults), passed
 * in so the page needs no other query.
 */
export async function listCaseload(
  {
    organisationIds,
    query,
    dueSoonDays,
    today = todayIso(),
    countCap = COUNT_CAP,
    twocWindowHours = TWOC_DEFAULTS.voidWindowHours.value,
    now = new Date(),
  }: { organisationIds: string[]; query: CaseloadQuery; dueSoonDays: number; today?: string; countCap?: number; twocWindowHours?: number; now?: Date },
  tx: Executor = db,
): Promise<CaseloadPage> {
  const base = { page: query.page, pageSize: query.pageSize, today, dueSoonDays };
  if (organisationIds.length === 0) return { rows: [], total: 0, totalIsAtLeast: false, ...base };
  const offset = (query.page - 1) * query.pageSize;
  // Enough to know the pages up to this one and that another follows; plus one to tell "more".
  const cap = Math.max(countCap, offset + query.pageSize) + 1;
  const window = { hours: twocWindowHours, now };
  const { rows, total, totalIsAtLeast } = await readView({ organisationIds, view: query, today, dueSoonDays, window }, query.pageSize, offset, cap, tx);
  return { rows, total, totalIsAtLeast, ...base };
}

/** Every row of the filtered view, in the same order (for the CSV export). One statement per part. */
export async function listCaseloadAll(
  {
    organisationIds,
    view,
    dueSoonDays,
    today = todayIso(),
    max = 50_000,
    twocWindowHours = TWOC_DEFAULTS.voidWindowHours.value,
    now = new Date(),
  }: { organisationIds: string[]; view: CaseloadView; dueSoonDays: number; today?: string; max?: number; twocWindowHours?: number; now?: Date },
  tx: Executor = db,
): Promise<{ rows: CaseloadRow[]; total: number; today: string }> {
  if (organisationIds.length === 0) return { rows: [], total: 0, today };
  const window = { hours: twocWindowHours, now };
  const { rows, total } = await readView({ organisationIds, view, today, dueSoonDays, window }, max, 0, null, tx);
  return { rows, total, today };
}
