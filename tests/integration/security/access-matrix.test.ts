import { beforeAll, describe, expect, it } from "vitest";
import { call, sessionFor } from "../../support/http";
import { fillPattern, listRouteFiles, methods, type Method } from "../../support/routes";
import { matrix, personas, type Fixture, type Persona } from "./access-matrix";
import { securityFixture } from "./fixture";

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
  fixture = await securityFixture();
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
        const query = typeof row.query === "function" ? row.query(fixture) : row.query;
        const path = fillPattern(d!.pattern, params) + (query ? `?${query}` : "");
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
