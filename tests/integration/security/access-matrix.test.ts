import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { PNG } from "pngjs";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { patients, uploads, user } from "@/db/schema";
import { putObject } from "@/lib/storage";
import { call, sessionFor } from "../../support/http";
import { fillPattern, listRouteFiles, methods, type Method } from "../../support/routes";
import { matrix, personas, type Fixture, type Persona } from "./access-matrix";

const personaAccount: Record<Exclude<Persona, "anonymous">, Parameters<typeof sessionFor>[0]> = {
  admin: "admin",
  careTeamClinician: "communityNurse",
  otherClinician: "wardNurse",
  patient: "patient",
  otherPatient: "patientAr",
  carer: "carer",
};

type Handler = (req: Request, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;

const discovered: { key: string; pattern: string; method: Method; handler: Handler }[] = [];
let fixture: Fixture;

beforeAll(async () => {
  for (const { pattern, file } of listRouteFiles()) {
    const mod = (await import(file)) as Record<string, unknown>;
    for (const m of methods) {
      if (typeof mod[m] === "function") discovered.push({ key: `${m} ${pattern}`, pattern, method: m, handler: mod[m] as Handler });
    }
  }
  const [arthur] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
  const [yusuf] = await db.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-003"));
  // A finished upload on Arthur's record (a small PNG in the store), for the upload rows.
  const [grace] = await db.select({ id: user.id }).from(user).where(eq(user.email, "community.nurse@eastmere.example"));
  const objectKey = `patients/${arthur.id}/${randomUUID()}`;
  await putObject({ key: objectKey, body: PNG.sync.write(new PNG({ width: 2, height: 2 })), contentType: "image/png" });
  const [upload] = await db
    .insert(uploads)
    .values({ patientId: arthur.id, uploadedByUserId: grace.id, category: "packaging-label", objectKey, label: "Matrix fixture", contentType: "image/png", sizeBytes: 70, status: "ready" })
    .returning({ id: uploads.id });
  fixture = { patientId: arthur.id, otherPatientId: yusuf.id, uploadId: upload.id };
});

describe("security matrix: every route handler × every persona", () => {
  it("has a row for every route handler under app/api, and no row for a route that does not exist", () => {
    const keys = discovered.map((d) => d.key).sort();
    const rows = matrix.map((r) => r.route).sort();
    expect(keys.filter((k) => !rows.includes(k as never)), "routes missing from the matrix").toEqual([]);
    expect(rows.filter((r) => !keys.includes(r)), "matrix rows for routes that do not exist").toEqual([]);
  });

  for (const row of matrix) {
    if ("exempt" in row) continue;
    for (const persona of personas) {
      const want = row.expect[persona];
      it(`${row.route} as ${persona} → ${want}`, async () => {
        const d = discovered.find((x) => x.key === row.route);
        expect(d, `${row.route} exists`).toBeTruthy();
        const params = row.params ? row.params(fixture) : {};
        const path = fillPattern(d!.pattern, params) + (row.query ? `?${row.query}` : "");
        const cookie = persona === "anonymous" ? undefined : await sessionFor(personaAccount[persona]);
        const body = d!.method === "GET" || d!.method === "DELETE" ? undefined : {};
        const res = await call(d!.handler, path, { method: d!.method, cookie, params, body });
        if (want === "allowed") expect([401, 403, 404], `${persona} should get through`).not.toContain(res.status);
        else expect(res.status).toBe(want);
        expect(res.status, "never a server error").toBeLessThan(500);
      });
    }
  }
});
