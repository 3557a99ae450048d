import "server-only";
// What a care team's weekly digest lists: the catheters of its patients with a planned change or
// a review of need overdue or due in the next days, and messages about them that failed.
import { and, asc, eq, gte, inArray, isNotNull, isNull, sql } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { careTeam, catheterEpisodes, organisations, outboundMessages, patients } from "@/db/schema";

export async function listDigestOrganisations({ organisationIds }: { organisationIds?: string[] } = {}, tx: Executor = db) {
  const where = [inArray(organisations.kind, ["hospital_ward", "community_team"]), isNotNull(organisations.inboxEmail)];
  if (organisationIds) where.push(inArray(organisations.id, organisationIds.length ? organisationIds : ["00000000-0000-0000-0000-000000000000"]));
  return tx
    .select({ id: organisations.id, name: organisations.name, inboxEmail: organisations.inboxEmail, locale: organisations.locale })
    .from(organisations)
    .where(and(...where))
    .orderBy(asc(organisations.name));
}

/** Active catheters of the team's open patients whose change or review falls on or before `until`. */
export async function listDueEpisodes({ organisationId, until }: { organisationId: string; until: string }, tx: Executor = db) {
  return tx
    .select({
      patientId: patients.id,
      name: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
      healthRecordNumber: patients.healthRecordNumber,
      plannedChangeOn: catheterEpisodes.plannedChangeOn,
      reviewDueOn: catheterEpisodes.reviewDueOn,
      sizeCh: catheterEpisodes.sizeCh,
      route: catheterEpisodes.route,
    })
    .from(careTeam)
    .innerJoin(patients, eq(patients.id, careTeam.patientId))
    .innerJoin(catheterEpisodes, and(eq(catheterEpisodes.patientId, patients.id), isNull(catheterEpisodes.removedAt)))
    .where(
      and(
        eq(careTeam.organisationId, organisationId),
        isNull(patients.closedAt),
        sql`least(${catheterEpisodes.plannedChangeOn}, ${catheterEpisodes.reviewDueOn}) <= ${until}::date`,
      ),
    )
    .orderBy(asc(patients.familyName), asc(patients.givenName));
}

/** Messages about the team's patients that failed since `since` and were not resent. */
export async function listFailedMessages({ organisationId, since }: { organisationId: string; since: Date }, tx: Executor = db) {
  return tx
    .select({
      id: outboundMessages.id,
      patientId: outboundMessages.patientId,
      name: sql<string>`${patients.givenName} || ' ' || ${patients.familyName}`,
      healthRecordNumber: patients.healthRecordNumber,
      kind: outboundMessages.kind,
      subject: outboundMessages.subject,
      lastError: outboundMessages.lastError,
      createdAt: outboundMessages.createdAt,
    })
    .from(outboundMessages)
    .innerJoin(patients, eq(patients.id, outboundMessages.patientId))
    .innerJoin(careTeam, and(eq(careTeam.patientId, patients.id), eq(careTeam.organisationId, organisationId)))
    .where(
      and(
        eq(outboundMessages.status, "failed"),
        // E-mails only: the care team cannot resend a person's own reminder texts and pushes.
        eq(outboundMessages.channel, "email"),
        gte(outboundMessages.createdAt, since),
        // Not once a resend of it is on its way or delivered.
        sql`not exists (select 1 from outbound_messages r where r.resend_of_id = ${outboundMessages.id} and r.status <> 'failed')`,
      ),
    )
    .orderBy(asc(outboundMessages.createdAt));
}
