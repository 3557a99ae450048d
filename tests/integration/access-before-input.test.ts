// Access is settled before input is validated: someone who may not see a record gets the same
// 404 for a bad request about it as for a good one, so a validation answer tells them nothing
// (ASVS 8.2.2). Its own people still get the 400 that says what to fix.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as bagChangesPost } from "@/app/api/bag-changes/route";
import { POST as checkInsPost } from "@/app/api/check-ins/route";
import { GET as diaryGet, POST as diaryPost } from "@/app/api/diary/route";
import { GET as accessLogGetRaw } from "@/app/api/patients/[patientId]/access-log/route";
import { GET as exportGetRaw } from "@/app/api/patients/[patientId]/export/route";
import { PATCH as patientPatchRaw } from "@/app/api/patients/[patientId]/route";
import { db } from "@/db";
import { patients } from "@/db/schema";
import { call, sessionFor } from "../support/http";

const accessLogGet = accessLogGetRaw as unknown as Parameters<typeof call>[0];
const exportGet = exportGetRaw as unknown as Parameters<typeof call>[0];
const patientPatch = patientPatchRaw as unknown as Parameters<typeof call>[0];

let arthur: string;
beforeAll(async () => {
  const [p] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  arthur = p.id;
});

describe("a bad request about someone else's record is a 404, not a 400", () => {
  it("portal routes whose patient is in the body or the query", async () => {
    const stranger = await sessionFor("patientAr");
    const own = await sessionFor("patient");
    const badDiary = { patientId: arthur, kind: "in", volumeMl: "a lot" };
    expect((await call(diaryPost, "/api/diary", { body: badDiary, cookie: stranger })).status).toBe(404);
    expect((await call(diaryPost, "/api/diary", { body: badDiary, cookie: own })).status).toBe(400);
    expect((await call(checkInsPost, "/api/check-ins", { body: { patientId: arthur, answers: "?" }, cookie: stranger })).status).toBe(404);
    expect((await call(bagChangesPost, "/api/bag-changes", { body: { patientId: arthur, kind: "hat" }, cookie: stranger })).status).toBe(404);
    expect((await call(diaryGet, `/api/diary?patientId=${arthur}&from=yesterday`, { cookie: stranger })).status).toBe(404);
    expect((await call(diaryGet, `/api/diary?patientId=${arthur}&from=yesterday`, { cookie: own })).status).toBe(400);
    // No patient named, or not an id: no record to learn about, so the fields are the answer.
    const missing = await call(diaryPost, "/api/diary", { body: { kind: "in", volumeMl: 200 }, cookie: stranger });
    expect(missing.status).toBe(400);
    expect(Object.keys((await missing.json()).error.fields)).toEqual(["patientId"]);
  });

  it("staff and export routes whose patient is in the path", async () => {
    const otherTeam = await sessionFor("wardNurse");
    const params = { patientId: arthur };
    expect((await call(patientPatch, `/api/patients/${arthur}`, { method: "PATCH", body: { weightKg: "heavy" }, cookie: otherTeam, params })).status).toBe(404);
    expect((await call(accessLogGet, `/api/patients/${arthur}/access-log?page=zero`, { cookie: otherTeam, params })).status).toBe(404);
    expect((await call(exportGet, `/api/patients/${arthur}/export?format=xml`, { cookie: await sessionFor("patientAr"), params })).status).toBe(404);
    expect((await call(exportGet, `/api/patients/${arthur}/export?format=xml`, { cookie: await sessionFor("patient"), params })).status).toBe(400);
  });
});
