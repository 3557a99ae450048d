import "server-only";
import { count, eq, inArray } from "drizzle-orm";
import { db } from "@/db";
import { memberships, organisations } from "@/db/schema";

export type OrganisationSummary = {
  id: string;
  name: string;
  kind: "hospital_ward" | "community_team" | "gp_practice";
  parentName: string | null;
  phone: string | null;
  inboxEmail: string | null;
  staffCount: number;
};

/** The organisations an admin manages, with their staff counts. */
export async function listOrganisationsManagedBy({ organisationIds }: { organisationIds: string[] }): Promise<OrganisationSummary[]> {
  if (organisationIds.length === 0) return [];
  const rows = await db
    .select({
      id: organisations.id,
      name: organisations.name,
      kind: organisations.kind,
      parentName: organisations.parentName,
      phone: organisations.phone,
      inboxEmail: organisations.inboxEmail,
      staffCount: count(memberships.id),
    })
    .from(organisations)
    .leftJoin(memberships, eq(memberships.organisationId, organisations.id))
    .where(inArray(organisations.id, organisationIds))
    .groupBy(organisations.id)
    .orderBy(organisations.name);
  return rows.map((r) => ({ ...r, staffCount: Number(r.staffCount) }));
}

export async function listGpPractices() {
  return db
    .select({ id: organisations.id, name: organisations.name, phone: organisations.phone })
    .from(organisations)
    .where(eq(organisations.kind, "gp_practice"))
    .orderBy(organisations.name);
}
