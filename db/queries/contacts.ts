import "server-only";
import { eq, inArray } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, organisations, settings } from "@/db/schema";

/** A phone number as typed by an admin, reduced to what a tel: link takes. */
export function telHref(phone: string): string {
  return `tel:${phone.replace(/[^+0-9]/g, "")}`;
}

const PHONE = /^\+?[0-9][0-9 ()-]{1,19}$/;

/**
 * The deployment's emergency number from the settings table, or null when it is not set or
 * not a phone number: the portal then says it is not configured rather than guess one.
 * TODO(lead): replace with getSettings().emergencyNumber from lib/config/settings.ts once it lands.
 */
export async function readEmergencyNumber(tx: Executor = db): Promise<string | null> {
  const [row] = await tx.select({ value: settings.value }).from(settings).where(eq(settings.key, "emergencyNumber"));
  // drizzle parses a jsonb string a second time, so "999" can come back as the number 999.
  const raw = row?.value;
  const value = typeof raw === "number" && Number.isInteger(raw) && raw >= 0 ? String(raw) : raw;
  return typeof value === "string" && PHONE.test(value.trim()) ? value.trim() : null;
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
    readEmergencyNumber(),
    patientId ? getCareTeamContacts({ patientId }) : Promise.resolve([]),
  ]);
  return { emergencyNumber, team };
}
