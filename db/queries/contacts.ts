import "server-only";
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, organisations } from "@/db/schema";
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

export async function getLeadTeamContact({ patientId }: { patientId: string }, tx: Executor = db): Promise<LeadTeamContact | null> {
  const [[row], settings] = await Promise.all([
    tx
      .select({
        organisationId: organisations.id,
        name: organisations.name,
        kind: organisations.kind,
        phone: organisations.phone,
        outOfHoursPhone: organisations.outOfHoursPhone,
        inboxEmail: organisations.inboxEmail,
        locale: organisations.locale,
      })
      .from(careTeam)
      .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
      .where(and(eq(careTeam.patientId, patientId), inArray(organisations.kind, [...teamKinds])))
      // The lead first; a record from before leads were kept falls back to its first team by name.
      .orderBy(desc(careTeam.lead), asc(organisations.name))
      .limit(1),
    getSettings(tx),
  ]);
  if (!row) return null;
  const own = row.outOfHoursPhone;
  return {
    ...row,
    kind: row.kind as LeadTeamContact["kind"],
    outOfHoursPhone: own ?? settings.outOfHoursPhone,
    outOfHoursIsService: !own && settings.outOfHoursPhone !== null,
    outOfHoursServiceName: own ? null : settings.outOfHoursServiceName,
  };
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
