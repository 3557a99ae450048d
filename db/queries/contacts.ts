import "server-only";
import { eq, inArray } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, organisations } from "@/db/schema";
import { getEmergencyNumber } from "@/lib/config/settings";

/** A phone number as typed by an admin, reduced to what a tel: link takes. */
export function telHref(phone: string): string {
  return `tel:${phone.replace(/[^+0-9]/g, "")}`;
}

export type TeamContact = { name: string; phone: string | null; outOfHoursPhone: string | null };

/** The care team's organisations with their day and out-of-hours numbers (not GP practices). */
export async function getCareTeamContacts({ patientId }: { patientId: string }, tx: Executor = db): Promise<TeamContact[]> {
  return tx
    .select({ name: organisations.name, phone: organisations.phone, outOfHoursPhone: organisations.outOfHoursPhone })
    .from(organisations)
    .where(
      inArray(organisations.id, tx.select({ id: careTeam.organisationId }).from(careTeam).where(eq(careTeam.patientId, patientId))),
    )
    .orderBy(organisations.name);
}

export type HelpContacts = { emergencyNumber: string | null; team: TeamContact[] };

export async function getHelpContacts({ patientId }: { patientId: string | null }): Promise<HelpContacts> {
  const [emergencyNumber, team] = await Promise.all([
    // The one reader and the one validation of the number (lib/config/settings): null when unset or not valid.
    getEmergencyNumber(),
    patientId ? getCareTeamContacts({ patientId }) : Promise.resolve([]),
  ]);
  return { emergencyNumber, team };
}
