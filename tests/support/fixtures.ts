// Test-only organisations, clinicians and patients of their own, so a test that adds data does
// not change what other tests see in the demo organisations. Each fixture removes itself.
import { randomBytes } from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import { db } from "@/db";
import { careTeam, organisations, patients, user, visitAccess, type NewCatheterEpisode } from "@/db/schema";
import { signIn } from "./http";
import { createOrganisation, createStaff } from "./staff";

export type ClinicianFixture = {
  organisationId: string;
  userId: string;
  email: string;
  cookie: string;
  cleanup: () => Promise<void>;
};

/** A new community team with one clinician (two-step sign-in set up, as staff must), signed in. */
export async function clinicianInNewTeam(label = "Fixture"): Promise<ClinicianFixture> {
  const tag = randomBytes(4).toString("hex");
  const password = `Fixture-${tag}-password`;
  const email = `fixture.${tag}@eastmere.example`;
  const org = await createOrganisation({ name: `${label} Team ${tag}`, kind: "community_team" });
  const { id: userId } = await createStaff({ role: "clinician", organisationIds: [org.id], name: `${label} Nurse ${tag}`, email, password });
  const cookie = await signIn(email, password);
  return {
    organisationId: org.id,
    userId,
    email,
    cookie,
    cleanup: async () => {
      const ids = (await db.select({ id: careTeam.patientId }).from(careTeam).where(eq(careTeam.organisationId, org.id))).map((r) => r.id);
      if (ids.length) await db.delete(patients).where(inArray(patients.id, ids));
      await db.delete(user).where(eq(user.id, userId));
      await db.delete(organisations).where(eq(organisations.id, org.id));
    },
  };
}

/** Time-limited visit access for a clinician outside the care team (as the QR flow grants it). */
export async function grantVisitAccess({ patientId, userId, minutes = 60 }: { patientId: string; userId: string; minutes?: number }) {
  const [row] = await db
    .insert(visitAccess)
    .values({ patientId, userId, reason: "Out-of-hours visit (test)", expiresAt: new Date(Date.now() + minutes * 60_000) })
    .returning({ id: visitAccess.id });
  // Ends the access again, so later tests see the clinician as an outsider.
  return async () => {
    await db.delete(visitAccess).where(eq(visitAccess.id, row.id));
  };
}

export async function patientIdByHrn(hrn: string): Promise<string> {
  const [p] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, hrn));
  if (!p) throw new Error(`no patient ${hrn}`);
  return p.id;
}

export async function userIdByEmail(email: string): Promise<string> {
  const [u] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
  return u.id;
}

const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/** The demo catheter's device facts, shared by stored rows and the forms' request bodies. */
export const demoDevice = {
  route: "urethral",
  catheterType: "two-way",
  material: "all-silicone",
  lengthCategory: "standard",
  sizeCh: 14,
  balloonMl: 10,
  makerBalloonMl: 10,
  maker: "Northfen Medical (demo)",
} as const;

/**
 * The demo catheter as the episode forms would store it (all-silicone 14 Ch two-way, 10 ml,
 * 84-day change, 28-day review), for tests that need a catheter in place without the forms.
 */
export function demoCatheterRow({
  patientId,
  organisationId,
  insertedAt = new Date(),
  ...over
}: Partial<NewCatheterEpisode> & Pick<NewCatheterEpisode, "patientId" | "organisationId"> & { insertedAt?: Date }): NewCatheterEpisode {
  return {
    patientId,
    organisationId,
    ...demoDevice,
    indication: "Chronic urinary retention",
    insertedAt,
    insertedByName: "Grace Mensah",
    gelKind: "plain",
    gelVolumeMl: 11,
    maxDwellDays: 84,
    plannedChangeOn: isoDay(new Date(insertedAt.getTime() + 84 * 86_400_000)),
    reviewDueOn: isoDay(new Date(insertedAt.getTime() + 28 * 86_400_000)),
    ...over,
  };
}
