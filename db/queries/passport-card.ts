import "server-only";
// The passport's device card: what a stranger holding the QR may see, and nothing that names the
// patient (no name, date of birth, address or record number). One round trip, so the public card
// stays quick under load.
import { fillPlaceholders, sql, type SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import pg from "pg";
import { db, pool, type Executor } from "@/db";
import type { AllergyAnswers, TwocOutcome } from "@/lib/clinical";
import { catheterEpisodes, visitAccess } from "@/db/schema";
import { settingFromJson } from "@/lib/config/settings";
import { countAttemptQuery } from "./attempt-counters";
import { leadTeamContact, leadTeamQuery } from "./contacts";
import { lastRemovalQuery, toLastRemoval, type LastRemoval } from "./episodes";

export type DeviceCard = {
  patientLocale: string;
  device: {
    route: (typeof catheterEpisodes.$inferSelect)["route"];
    catheterType: (typeof catheterEpisodes.$inferSelect)["catheterType"];
    material: (typeof catheterEpisodes.$inferSelect)["material"];
    lengthCategory: (typeof catheterEpisodes.$inferSelect)["lengthCategory"];
    sizeCh: number;
    balloonMl: number;
    gelKind: (typeof catheterEpisodes.$inferSelect)["gelKind"];
    insertedAt: string;
    plannedChangeOn: string;
    /** What an out-of-hours nurse needs before recatheterising. */
    lot: string | null;
    expiry: string | null;
    /** More than one attempt, or difficulties noted, at the last insertion. */
    difficult: boolean;
    difficulties: string | null;
  } | null;
  /** Valve or free drainage into a bag, from the latest discharge checklist; null when not recorded. */
  drainage: "valve" | "bag" | null;
  /** Only the allergies that matter for a catheter and its gel. */
  allergies: AllergyAnswers;
  /** The lead team's numbers (getLeadTeamContact: out of hours falls back to the deployment's service). */
  careTeam: { name: string; phone: string | null; outOfHoursPhone: string | null; outOfHoursServiceName: string | null } | null;
  /** With no catheter in place: when the last one came out, and how its trial without catheter went. */
  removal: LastRemoval | null;
};

type CardRow = {
  preferred_locale: string;
  allergy_latex: AllergyAnswers["latex"];
  allergy_chlorhexidine: AllergyAnswers["chlorhexidine"];
  allergy_lidocaine: AllergyAnswers["lidocaine"];
  route: NonNullable<DeviceCard["device"]>["route"] | null;
  catheter_type: NonNullable<DeviceCard["device"]>["catheterType"] | null;
  material: NonNullable<DeviceCard["device"]>["material"] | null;
  length_category: NonNullable<DeviceCard["device"]>["lengthCategory"] | null;
  size_ch: number | null;
  balloon_ml: number | null;
  gel_kind: NonNullable<DeviceCard["device"]>["gelKind"] | null;
  inserted_at: string | null;
  planned_change_on: string | null;
  lot: string | null;
  expiry: string | null;
  attempts: number | null;
  difficulties: string | null;
  drainage: "valve" | "bag" | null;
  organisation_id: string | null;
  name: string | null;
  kind: string | null;
  phone: string | null;
  out_of_hours_phone: string | null;
  inbox_email: string | null;
  locale: string | null;
  s_out_of_hours_phone: string | null;
  s_out_of_hours_service_name: string | null;
  s_region: string | null;
  last_removed_at: string | null;
  last_awaiting_twoc: boolean | null;
  last_twoc_outcome: TwocOutcome | null;
};

/**
 * The card's one statement for a patient id expression: the patient, the catheter in place, the
 * latest discharge checklist's drainage, the lead team (leadTeamQuery) and the three settings the
 * card shows (as JSON text, validated by settingFromJson).
 */
function cardQuery(patientId: SQL) {
  const setting = (key: string) => sql`(select value::text from settings where key = ${key})`;
  return sql`select p.preferred_locale, p.allergy_latex, p.allergy_chlorhexidine, p.allergy_lidocaine,
      e.route, e.catheter_type, e.material, e.length_category, e.size_ch, e.balloon_ml, e.gel_kind,
      to_char(e.inserted_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as inserted_at,
      e.planned_change_on::text as planned_change_on, e.lot, e.expiry::text as expiry, e.attempts, e.difficulties,
      c.drainage, t.organisation_id, t.name, t.kind, t.phone, t.out_of_hours_phone, t.inbox_email, t.locale,
      ${setting("outOfHoursPhone")} as s_out_of_hours_phone,
      ${setting("outOfHoursServiceName")} as s_out_of_hours_service_name,
      ${setting("region")} as s_region,
      r.last_removed_at, r.last_awaiting_twoc, r.last_twoc_outcome
    from patients p
    left join lateral (
      select * from catheter_episodes where patient_id = p.id and removed_at is null order by inserted_at desc limit 1
    ) e on true
    left join lateral (
      select drainage from discharge_checklists where patient_id = p.id order by created_at desc limit 1
    ) c on true
    left join lateral (${leadTeamQuery(sql`p.id`)}) t on true
    left join lateral (${lastRemovalQuery(sql`p.id`)}) r on true
    where p.id = ${patientId}`;
}

/** The card and the deployment's region (for its dates) from one row of cardQuery. */
function toDeviceCard(row: CardRow): { card: DeviceCard; region: string | null } {
  const service = {
    outOfHoursPhone: settingFromJson("outOfHoursPhone", row.s_out_of_hours_phone) as string | null,
    outOfHoursServiceName: settingFromJson("outOfHoursServiceName", row.s_out_of_hours_service_name) as string | null,
  };
  const lead = row.organisation_id
    ? leadTeamContact(
        { organisation_id: row.organisation_id, name: row.name!, kind: row.kind!, phone: row.phone, out_of_hours_phone: row.out_of_hours_phone, inbox_email: row.inbox_email, locale: row.locale! },
        service,
      )
    : null;
  const inPlace = row.size_ch !== null;
  return {
    region: settingFromJson("region", row.s_region) as string | null,
    card: {
      patientLocale: row.preferred_locale,
      device: inPlace
        ? {
            route: row.route!,
            catheterType: row.catheter_type!,
            material: row.material!,
            lengthCategory: row.length_category!,
            sizeCh: row.size_ch!,
            balloonMl: row.balloon_ml!,
            gelKind: row.gel_kind!,
            insertedAt: row.inserted_at!,
            plannedChangeOn: row.planned_change_on!,
            lot: row.lot ?? null,
            expiry: row.expiry ?? null,
            difficult: (row.attempts ?? 1) > 1 || Boolean(row.difficulties?.trim()),
            difficulties: row.difficulties?.trim() || null,
          }
        : null,
      drainage: row.drainage ?? null,
      removal: inPlace ? null : toLastRemoval({ removed_at: row.last_removed_at, awaiting_twoc: row.last_awaiting_twoc, twoc_outcome: row.last_twoc_outcome }),
      allergies: { latex: row.allergy_latex, chlorhexidine: row.allergy_chlorhexidine, lidocaine: row.allergy_lidocaine },
      careTeam:
        lead && (lead.phone || lead.outOfHoursPhone)
          ? { name: lead.name, phone: lead.phone, outOfHoursPhone: lead.outOfHoursPhone, outOfHoursServiceName: lead.outOfHoursServiceName }
          : null,
    },
  };
}

export async function getDeviceCard({ patientId }: { patientId: string }, tx: Executor = db): Promise<DeviceCard | null> {
  const result = await tx.execute<CardRow>(cardQuery(sql`${patientId}::uuid`));
  return result.rows[0] ? toDeviceCard(result.rows[0]).card : null;
}

/** What opening a card by QR token came to, from the one statement below. */
export type CardByToken =
  | { kind: "limited"; retryAfterSeconds: number }
  | { kind: "invalid" }
  | { kind: "ok"; card: DeviceCard; region: string | null; patientId: string; passportId: string };

type OpenCardRow = CardRow & { count: number; window_started_at: string; patient_id: string | null; passport_id: string | null };

/**
 * The address's attempt counted (the card limit), the current passport found by the token's
 * hash, its card read, and the view audited — or the miss audited without a patient — all in one
 * statement, so the audit is neither an extra wait nor ever lost. Over the limit, nothing is
 * looked up and nothing audited. Placeholders, filled per request.
 */
function openCardStatement() {
  const p = (name: keyof OpenCardValues) => sql.placeholder(name);
  return sql`
    with lim as (${countAttemptQuery({ key: p("limitKey"), windowSeconds: p("windowSeconds") })}),
    pp as (
      select id as passport_id, patient_id from passports
      where token_hash = ${p("tokenHash")} and revoked_at is null and (select count from lim) <= ${p("max")}
    ),
    card as (${cardQuery(sql`(select patient_id from pp)`)}),
    aud as (
      insert into audit_events (action, actor_user_id, actor_role, patient_id, via, ip_hash, details)
      select case when c.preferred_locale is null then 'passport.card.invalid' else 'passport.card.view' end,
             ${p("actorUserId")}, ${p("actorRole")},
             case when c.preferred_locale is null then null else pp.patient_id end,
             'qr', ${p("ipHash")},
             case when c.preferred_locale is null then '{}'::jsonb
                  else jsonb_build_object('passportId', pp.passport_id, 'by', 'token') end
      from (select 1) one left join pp on true left join card c on true
      where (select count from lim) <= ${p("max")}
      returning 1
    )
    select lim.count, lim.window_started_at, pp.patient_id, pp.passport_id, card.*, (select count(*) from aud) as audited
    from lim left join pp on true left join card on true`;
}

type OpenCardValues = { limitKey: string; windowSeconds: number; tokenHash: string; max: number; actorUserId: string | null; actorRole: string | null; ipHash: string | null };

// Its text made once per process. Sent as a NAMED prepared statement: each pooled connection
// parses and plans it once and then only binds the values (PostgreSQL's plan cache; it was
// parsed and planned on every scan, about 1 ms of the database's CPU per card). The name is
// fixed, so a connection never holds two versions of it.
let prepared: { name: string; text: string; params: unknown[] } | undefined;
function openCardQuery() {
  if (!prepared) {
    const { sql: text, params } = new PgDialect().sqlToQuery(openCardStatement());
    prepared = { name: "caddis_open_card_by_token", text, params };
  }
  return prepared;
}

// Dates and times as PostgreSQL's text, as drizzle's node-postgres driver reads them for every
// other statement (CardRow's types), instead of node-postgres's own Date objects.
const asText = (value: string) => value;
const rawTimes = new Set<number>([pg.types.builtins.TIMESTAMPTZ, pg.types.builtins.TIMESTAMP, pg.types.builtins.DATE, pg.types.builtins.INTERVAL]);
const types = {
  getTypeParser: (oid: number, format?: "text" | "binary") => (rawTimes.has(oid) ? asText : pg.types.getTypeParser(oid, format as "text")),
} as pg.CustomTypesConfig;

/**
 * A QR token's card in one round trip (openCardStatement), on the app's pool. The statement is
 * prepared once per connection, so it is never sent inside another transaction.
 */
export async function openCardByTokenHash(input: {
  tokenHash: string;
  limit: { key: string; max: number; windowSeconds: number };
  actor: { userId: string; role: string } | null;
  ipHash: string | null;
}): Promise<CardByToken> {
  const { key, max, windowSeconds } = input.limit;
  const values: OpenCardValues = { limitKey: key, windowSeconds, tokenHash: input.tokenHash, max, actorUserId: input.actor?.userId ?? null, actorRole: input.actor?.role ?? null, ipHash: input.ipHash };
  const { name, text, params } = openCardQuery();
  const result = await pool.query<OpenCardRow>({ name, text, values: fillPlaceholders(params, values), types });
  const row = result.rows[0]!;
  if (Number(row.count) > max) {
    const started = new Date(row.window_started_at).getTime();
    return { kind: "limited", retryAfterSeconds: Math.max(1, Math.ceil((started + windowSeconds * 1000 - Date.now()) / 1000)) };
  }
  if (!row.passport_id || row.preferred_locale === null) return { kind: "invalid" };
  const { card, region } = toDeviceCard(row);
  return { kind: "ok", card, region, patientId: row.patient_id!, passportId: row.passport_id };
}

export async function grantVisitAccess(
  { patientId, userId, reason, hours }: { patientId: string; userId: string; reason: string; hours: number },
  tx: Executor = db,
) {
  const expiresAt = new Date(Date.now() + hours * 3600_000);
  const [row] = await tx.insert(visitAccess).values({ patientId, userId, reason, expiresAt }).returning({ id: visitAccess.id });
  return { id: row!.id, expiresAt };
}
