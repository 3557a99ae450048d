// The records the security suites aim at: Arthur Pell's (care team Harbourside, carer Joan Pell),
// Yusuf Haddad's as "another patient", a finished upload on Arthur's record, and staff ids.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { PNG } from "pngjs";
import { db } from "@/db";
import { caseloadItems, organisations, patients, referrals, uploads, user } from "@/db/schema";
import { putObject } from "@/lib/storage";
import type { Fixture } from "./access-matrix";

export async function securityFixture(): Promise<Fixture> {
  const [arthur] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  const [yusuf] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-003"));
  const [grace] = await db.select({ id: user.id }).from(user).where(eq(user.email, "community.nurse@eastmere.example"));
  const objectKey = `patients/${arthur.id}/${randomUUID()}`;
  await putObject({ key: objectKey, body: PNG.sync.write(new PNG({ width: 2, height: 2 })), contentType: "image/png" });
  const [upload] = await db
    .insert(uploads)
    .values({ patientId: arthur.id, uploadedByUserId: grace.id, category: "packaging-label", objectKey, label: "Matrix fixture", contentType: "image/png", sizeBytes: 70, status: "ready" })
    .returning({ id: uploads.id });
  const [harbourside] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
  const [admin] = await db.select({ id: user.id }).from(user).where(eq(user.email, "admin@eastmere.example"));
  const [priya] = await db.select({ id: user.id }).from(user).where(eq(user.email, "rowan.nurse@eastmere.example"));
  const [item] = await db
    .insert(caseloadItems)
    .values({ patientId: arthur.id, kind: "news2", level: "medium", summary: "Matrix fixture", reporter: { kind: "patient" }, dueAt: new Date(Date.now() + 3_600_000) })
    .returning({ id: caseloadItems.id });
  const [rowan] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Rowan Ward"));
  const [referral] = await db
    .insert(referrals)
    .values({ patientId: arthur.id, fromOrganisationId: harbourside.id, toOrganisationId: rowan.id, referredByUserId: grace.id, handoverNote: "Matrix fixture referral", referrerStays: true })
    .returning({ id: referrals.id });
  const [incoming] = await db
    .insert(referrals)
    .values({ patientId: arthur.id, fromOrganisationId: rowan.id, toOrganisationId: harbourside.id, referredByUserId: priya.id, handoverNote: "Bad-input fixture referral", referrerStays: true })
    .returning({ id: referrals.id });
  return {
    patientId: arthur.id,
    otherPatientId: yusuf.id,
    uploadId: upload.id,
    organisationId: harbourside.id,
    staffUserId: grace.id,
    adminUserId: admin.id,
    bystanderStaffUserId: priya.id,
    caseloadItemId: item.id,
    referralId: referral.id,
    incomingReferralId: incoming.id,
  };
}
