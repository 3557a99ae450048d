import "server-only";
// Registering, reading and editing a patient's details. Access checks happen before these are
// called (lib/records/patient-record.ts); these functions return explicit DTOs, never whole rows.
import { and, asc, desc, eq, inArray, isNull } from "drizzle-orm";
import { db, readTogether, type Executor } from "@/db";
import { careTeam, catheterEpisodes, organisations, patients, type CatheterEpisode, type Patient } from "@/db/schema";
import type { AllergyAnswers } from "@/lib/clinical";
import { AppError, pgConstraint, toAppError } from "@/lib/http/errors";
import type { PatientUpdateValues, PatientValues } from "@/lib/validations/patient";

export type PatientDetails = {
  id: string;
  givenName: string;
  familyName: string;
  healthRecordNumber: string;
  dateOfBirth: string;
  sex: Patient["sex"];
  preferredLocale: string;
  weightKg: number | null;
  allergies: PatientAllergies;
  gpPractice: { id: string; name: string; phone: string | null } | null;
  careTeam: { id: string; name: string; kind: string; phone: string | null }[];
  fluidLimitMl: number | null;
  latestCheckInLevel: Patient["latestCheckInLevel"];
  latestCheckInAt: string | null;
  hasPortalAccount: boolean;
  /** Discharged from the catheter caseload after a passed trial, with the follow-up review day. */
  catheterDischargedAt: string | null;
  followUpReviewOn: string | null;
};

export type CurrentEpisode = Omit<
  CatheterEpisode,
  "insertedAt" | "removedAt" | "createdAt" | "updatedAt" | "findings" | "overrides" | "insertedByUserId"
> & {
  insertedAt: string;
  removedAt: string | null;
  findings: { severity?: string; code?: string; message?: string }[];
  overrides: { code: string; reason: string }[];
};

export type PatientRecord = { patient: PatientDetails; currentEpisode: CurrentEpisode | null };

export type PatientAllergies = AllergyAnswers & { other: string | null };

function toDetails(
  p: Patient,
  gp: PatientDetails["gpPractice"],
  team: PatientDetails["careTeam"],
): PatientDetails {
  return {
    id: p.id,
    givenName: p.givenName,
    familyName: p.familyName,
    healthRecordNumber: p.healthRecordNumber,
    dateOfBirth: p.dateOfBirth,
    sex: p.sex,
    preferredLocale: p.preferredLocale,
    weightKg: p.weightKg ?? null,
    allergies: {
      latex: p.allergyLatex,
      chlorhexidine: p.allergyChlorhexidine,
      lidocaine: p.allergyLidocaine,
      other: p.allergyOther ?? null,
    },
    gpPractice: gp,
    careTeam: team,
    fluidLimitMl: p.fluidLimitMl ?? null,
    latestCheckInLevel: p.latestCheckInLevel ?? null,
    latestCheckInAt: p.latestCheckInAt ? p.latestCheckInAt.toISOString() : null,
    hasPortalAccount: Boolean(p.userId),
    catheterDischargedAt: p.catheterDischargedAt ? p.catheterDischargedAt.toISOString() : null,
    followUpReviewOn: p.followUpReviewOn ?? null,
  };
}

function toEpisode(e: CatheterEpisode): CurrentEpisode {
  const { insertedAt, removedAt, createdAt: _c, updatedAt: _u, insertedByUserId: _i, findings, overrides, ...rest } = e;
  return {
    ...rest,
    insertedAt: insertedAt.toISOString(),
    removedAt: removedAt ? removedAt.toISOString() : null,
    findings: Array.isArray(findings) ? (findings as CurrentEpisode["findings"]) : [],
    overrides: Array.isArray(overrides) ? overrides : [],
  };
}

/** When the record was closed, or null while it is open. */
export async function getRecordClosedAt({ patientId }: { patientId: string }, tx: Executor = db): Promise<Date | null> {
  const [row] = await tx.select({ closedAt: patients.closedAt }).from(patients).where(eq(patients.id, patientId));
  return row?.closedAt ?? null;
}

/** The patient's details, care team, GP practice and the catheter in place (if any). */
export async function getPatientRecord({ patientId }: { patientId: string }, tx: Executor = db): Promise<PatientRecord | null> {
  const [p] = await tx.select().from(patients).where(eq(patients.id, patientId));
  if (!p) return null;
  const [gpRows, team, episodes] = await readTogether(
    tx,
    () => p.gpPracticeId
      ? tx
          .select({ id: organisations.id, name: organisations.name, phone: organisations.phone })
          .from(organisations)
          .where(eq(organisations.id, p.gpPracticeId))
      : Promise.resolve([]),
    () => tx
      .select({ id: organisations.id, name: organisations.name, kind: organisations.kind, phone: organisations.phone })
      .from(careTeam)
      .innerJoin(organisations, eq(organisations.id, careTeam.organisationId))
      .where(eq(careTeam.patientId, patientId))
      .orderBy(asc(organisations.name)),
    () => tx
      .select()
      .from(catheterEpisodes)
      .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)))
      .orderBy(desc(catheterEpisodes.insertedAt))
      .limit(1),
  );
  return {
    patient: toDetails(p, gpRows[0] ?? null, team),
    currentEpisode: episodes[0] ? toEpisode(episodes[0]) : null,
  };
}

async function assertGpPractice(gpPracticeId: string, tx: Executor) {
  const [gp] = await tx
    .select({ id: organisations.id })
    .from(organisations)
    .where(and(eq(organisations.id, gpPracticeId), eq(organisations.kind, "gp_practice")));
  if (!gp) throw new AppError("validation_failed", undefined, { fields: { gpPracticeId: ["gp_unknown"] } });
}

// A duplicate health record number is the patient's own field error, not a server error.
function hrnConflict(error: unknown): never {
  const e = toAppError(error);
  if (e.code === "conflict" && pgConstraint(error) === "patients_hrn_uq") {
    throw new AppError("conflict", "A patient with this health record number is already registered.", {
      fields: { healthRecordNumber: ["hrn_taken"] },
      cause: error,
    });
  }
  throw error;
}

/** Inserts the patient and their care team. Call inside a transaction with the audit event. */
export async function createPatient(
  { input, allowedOrganisationIds }: { input: PatientValues; allowedOrganisationIds: string[] },
  tx: Executor,
): Promise<{ id: string }> {
  const teamIds = [...new Set(input.careTeamOrganisationIds)];
  if (teamIds.some((id) => !allowedOrganisationIds.includes(id))) {
    throw new AppError("validation_failed", undefined, { fields: { careTeamOrganisationIds: ["care_team_not_yours"] } });
  }
  await assertGpPractice(input.gpPracticeId, tx);
  let id: string;
  try {
    const [row] = await tx
      .insert(patients)
      .values({
        givenName: input.givenName,
        familyName: input.familyName,
        healthRecordNumber: input.healthRecordNumber,
        dateOfBirth: input.dateOfBirth,
        sex: input.sex,
        preferredLocale: input.preferredLocale,
        weightKg: input.weightKg,
        allergyLatex: input.allergies.latex,
        allergyChlorhexidine: input.allergies.chlorhexidine,
        allergyLidocaine: input.allergies.lidocaine,
        allergyOther: input.allergies.other,
        gpPracticeId: input.gpPracticeId,
      })
      .returning({ id: patients.id });
    id = row.id;
  } catch (error) {
    hrnConflict(error);
  }
  // The first team chosen leads until a referral or the care team says otherwise.
  await tx.insert(careTeam).values(teamIds.map((organisationId, i) => ({ patientId: id, organisationId, lead: i === 0 })));
  return { id };
}

/** Changes the given fields only. Call inside a transaction with the audit event. */
export async function updatePatient(
  { patientId, input }: { patientId: string; input: PatientUpdateValues },
  tx: Executor,
): Promise<{ changed: string[] }> {
  if (input.gpPracticeId) await assertGpPractice(input.gpPracticeId, tx);
  const values: Partial<typeof patients.$inferInsert> = {};
  const changed: string[] = [];
  const set = <K extends keyof typeof patients.$inferInsert>(key: K, value: (typeof patients.$inferInsert)[K], label: string) => {
    values[key] = value;
    changed.push(label);
  };
  if (input.givenName !== undefined) set("givenName", input.givenName, "givenName");
  if (input.familyName !== undefined) set("familyName", input.familyName, "familyName");
  if (input.healthRecordNumber !== undefined) set("healthRecordNumber", input.healthRecordNumber, "healthRecordNumber");
  if (input.dateOfBirth !== undefined) set("dateOfBirth", input.dateOfBirth, "dateOfBirth");
  if (input.sex !== undefined) set("sex", input.sex, "sex");
  if (input.preferredLocale !== undefined) set("preferredLocale", input.preferredLocale, "preferredLocale");
  if (input.weightKg !== undefined) set("weightKg", input.weightKg, "weightKg");
  if (input.gpPracticeId !== undefined) set("gpPracticeId", input.gpPracticeId, "gpPracticeId");
  if (input.allergies !== undefined) {
    values.allergyLatex = input.allergies.latex;
    values.allergyChlorhexidine = input.allergies.chlorhexidine;
    values.allergyLidocaine = input.allergies.lidocaine;
    values.allergyOther = input.allergies.other;
    changed.push("allergies");
  }
  try {
    await tx.update(patients).set(values).where(eq(patients.id, patientId));
  } catch (error) {
    hrnConflict(error);
  }
  return { changed };
}

/** The GP practices of the directory, for the registration form. */
export async function listGpPracticeDirectory(tx: Executor = db) {
  return tx
    .select({ id: organisations.id, name: organisations.name, phone: organisations.phone })
    .from(organisations)
    .where(eq(organisations.kind, "gp_practice"))
    .orderBy(asc(organisations.name));
}

/** The viewer's own organisations that can hold a caseload (wards and community teams). */
export async function listCareTeamOptions({ organisationIds }: { organisationIds: string[] }, tx: Executor = db) {
  if (organisationIds.length === 0) return [];
  return tx
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind, parentName: organisations.parentName })
    .from(organisations)
    .where(and(inArray(organisations.id, organisationIds), inArray(organisations.kind, ["hospital_ward", "community_team"])))
    .orderBy(asc(organisations.name));
}
