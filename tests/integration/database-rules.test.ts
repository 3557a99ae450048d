// Rules the database itself holds, so no code path can write a record that breaks them.
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db";
import { auditEvents, catheterEpisodes, diaryEntries, patients } from "@/db/schema";
import { audit } from "@/lib/records/audit";
import { toAppError } from "@/lib/http/errors";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

async function aPatientId() {
  const [p] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  return p.id;
}

const device = {
  route: "urethral" as const,
  catheterType: "two-way" as const,
  material: "all-silicone" as const,
  lengthCategory: "standard" as const,
  sizeCh: 14,
  balloonMl: 10,
  indication: "test",
  insertedAt: new Date(),
  insertedByName: "Test",
  plannedChangeOn: "2027-01-01",
  reviewDueOn: "2026-12-20",
};

describe("database rules", () => {
  it("refuses a balloon volume of 0 ml and reports it as a validation error", async () => {
    const patientId = await aPatientId();
    const err = await db
      .insert(catheterEpisodes)
      .values({ ...device, patientId, balloonMl: 0 })
      .catch((e: unknown) => e);
    expect(toAppError(err).code).toBe("validation_failed");
  });

  it("allows only one catheter in place per patient", async () => {
    const patientId = await aPatientId();
    const err = await db.insert(catheterEpisodes).values({ ...device, patientId }).catch((e: unknown) => e);
    expect(toAppError(err).code).toBe("conflict");
  });

  it("refuses a duplicate health record number as a conflict, not a 500", async () => {
    const err = await db
      .insert(patients)
      .values({ givenName: "A", familyName: "B", healthRecordNumber: "EM-100-001", dateOfBirth: "1950-01-01", sex: "male" })
      .catch((e: unknown) => e);
    expect(toAppError(err).status).toBe(409);
  });

  it("refuses diary volumes that cannot be right", async () => {
    const patientId = await aPatientId();
    for (const volumeMl of [0, -5, 9000]) {
      const err = await db.insert(diaryEntries).values({ patientId, kind: "in", volumeMl, at: new Date() }).catch((e: unknown) => e);
      expect(toAppError(err).code).toBe("validation_failed");
    }
  });

  it("writes an audit event with a hashed address, never the address", async () => {
    const patientId = await aPatientId();
    const headers = new Headers({ [CLIENT_ADDRESS_HEADER]: "203.0.113.9" });
    await audit({ action: "test.view", patientId, via: "care_team", request: { headers }, details: { n: 1 } });
    const [row] = await db.select().from(auditEvents).where(eq(auditEvents.action, "test.view"));
    expect(row.patientId).toBe(patientId);
    expect(row.ipHash).toMatch(/^[0-9a-f]{32}$/);
    expect(JSON.stringify(row)).not.toContain("203.0.113.9");
  });
});
