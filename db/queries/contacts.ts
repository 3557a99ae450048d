import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import { getEmergencyNumber, getSettings } from "@/lib/config/settings";

/** A phone number as typed by an admin, reduced to what a tel: link takes. */
export function telHref(phone: string): string {
  return `tel:${phone.replace(/[^+0-9]/g, "")}`;
}

export type TeamContact = { name: string; phone: string | null; outOfHoursPhone: string | null };

/**
 * The lead team's contact: the one set of numbers the patient's Get help, the device card, the
 * booklet and every alert show. `outOfHoursPhone` is the team's own, else the deployment's
 * out-of-hours service (Settings); `outOfHoursIsService` says which. Null when the patient has no
 * ward or community team at all.
 */
export type LeadTeamContact = {
  organisationId: string;
  name: string;
  kind: "hospital_ward" | "community_team";
  phone: string | null;
  inboxEmail: string | null;
  locale: string;
  outOfHoursPhone: string | null;
  outOfHoursIsService: boolean;
  /** The out-of-hours service's name (Settings), shown beside its number. */
  outOfHoursServiceName: string | null;
};

const teamKinds = ["hospital_ward", "community_team"] as const;

/**
 * The lead team's row: the lead first; a record from before leads were kept falls back to its
 * first ward or community team by name. The one statement of that choice, also read inside the
 * device card's single round trip (db/queries/passport-card.ts).
 */
export function leadTeamQuery(patientId: SQL) {
  return sql`select o.id as organisation_id, o.name, o.kind, o.phone, o.out_of_hours_phone, o.inbox_email, o.locale
    from care_team ct join organisations o on o.id = ct.organisation_id
    where ct.patient_id = ${patientId} and o.kind in (${sql.join(teamKinds.map((k) => sql`${k}`), sql`, `)})
    order by ct.lead desc, o.name asc
    limit 1`;
}

type LeadTeamRow = { organisation_id: string; name: string; kind: string; phone: string | null; out_of_hours_phone: string | null; inbox_email: string | null; locale: string };

/** The lead team's numbers, the deployment's out-of-hours service standing in for a team with none. */
export function leadTeamContact(row: LeadTeamRow, service: { outOfHoursPhone: string | null; outOfHoursServiceName: string | null }): LeadTeamContact {
  const own = row.out_of_hours_phone;
  return {
    organisationId: row.organisation_id,
    name: row.name,
    kind: row.kind as LeadTeamContact["kind"],
    phone: row.phone,
    inboxEmail: row.inbox_email,
    locale: row.locale,
    outOfHoursPhone: own ?? service.outOfHoursPhone,
    outOfHoursIsService: !own && service.outOfHoursPhone !== null,
    outOfHoursServiceName: own ? null : service.outOfHoursServiceName,
  };
}

export async function getLeadTeamContact({ patientId }: { patientId: string }, tx: Executor = db): Promise<LeadTeamContact | null> {
  const [result, settings] = await readTogether(tx, () => tx.execute<LeadTeamRow>(leadTeamQuery(sql`${patientId}::uuid`)), () => getSettings(tx));
  const row = result.rows[0];
  return row ? leadTeamContact(row, settings) : null;
}

/** What the portal's call buttons show: the emergency number and the lead team (none, or one). */
export type HelpContacts = { emergencyNumber: string | null; team: TeamContact[] };

export async function getHelpContacts({ patientId }: { patientId: string | null }): Promise<HelpContacts> {
  const [emergencyNumber, lead] = await Promise.all([
    // The one reader and the one validation of the number (lib/config/settings): null when unset or not valid.
    getEmergencyNumber(),
    patientId ? getLeadTeamContact({ patientId }) : Promise.resolve(null),
  ]);
  return { emergencyNumber, team: lead ? [{ name: lead.name, phone: lead.phone, outOfHoursPhone: lead.outOfHoursPhone }] : [] };
}
