import "server-only";
// Reads the e-mails need: the patient, their care-team organisations (with inbox and locale) and
// the catheter in place. Every function takes the caller's transaction.
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, catheterEpisodes, organisations, patients } from "@/db/schema";

export async function getPatientForMail({ patientId }: { patientId: string }, tx: Executor = db) {
  const [p] = await tx.select().from(patients).where(eq(patients.id, patientId));
  return p ?? null;
}

export type CareTeamOrganisation = {
  id: string;
  name: string;
  kind: string;
  inboxEmail: string | null;
  locale: string;
  phone: string | null;
  outOfHoursPhone: string | null;
};

const teamKinds = ["hospital_ward", "community_team"] as const;

export async function getCareTeamOrganisations({ patientId }: { patientId: string }, tx: Executor = db): Promise<CareTeamOrganisation[]> {
  return tx
    .select({
      id: organisations.id,
      name: organisations.name,
      kind: organisations.kind,
      inboxEmail: organisations.inboxEmail,
      locale: organisations.locale,
      phone: organisations.phone,
      outOfHoursPhone: organisations.outOfHoursPhone,
    })
    .from(careTeam)
    .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
    .where(and(eq(careTeam.patientId, patientId), inArray(organisations.kind, [...teamKinds])))
    .orderBy(asc(organisations.name));
}

export async function getActiveEpisode({ patientId }: { patientId: string }, tx: Executor = db) {
  const [e] = await tx
    .select()
    .from(catheterEpisodes)
    .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
  return e ?? null;
}

export async function getOrganisation({ id }: { id: string }, tx: Executor = db) {
  const [o] = await tx.select().from(organisations).where(eq(organisations.id, id));
  return o ?? null;
}
