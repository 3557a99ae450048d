// Function-level access (ASVS 8.2.1, 8.3.1): each role's API refuses the other roles on the server.
import { describe, expect, it } from "vitest";
import { GET as adminOrganisations } from "@/app/api/admin/organisations/route";
import { GET as caseload } from "@/app/api/caseload/route";
import { GET as me } from "@/app/api/me/route";
import { GET as portalBooklet } from "@/app/api/portal/booklet/route";
import { GET as portalToday } from "@/app/api/portal/today/route";
import { call, sessionFor } from "../support/http";

type Who = "anonymous" | "admin" | "communityNurse" | "patient" | "carer";
const routes = [
  { name: "GET /api/caseload", handler: caseload, path: "/api/caseload", allowed: ["communityNurse"] },
  { name: "GET /api/admin/organisations", handler: adminOrganisations, path: "/api/admin/organisations", allowed: ["admin"] },
  { name: "GET /api/portal/today", handler: portalToday, path: "/api/portal/today", allowed: ["patient", "carer"] },
  { name: "GET /api/portal/booklet", handler: portalBooklet, path: "/api/portal/booklet", allowed: ["patient", "carer"] },
  { name: "GET /api/me", handler: me, path: "/api/me", allowed: ["admin", "communityNurse", "patient", "carer"] },
] as const;
const everyone: Who[] = ["anonymous", "admin", "communityNurse", "patient", "carer"];

describe("role checks on the server", () => {
  for (const route of routes) {
    for (const who of everyone) {
      const allowed = (route.allowed as readonly string[]).includes(who);
      it(`${route.name} as ${who} → ${allowed ? "200" : who === "anonymous" ? "401" : "403"}`, async () => {
        const cookie = who === "anonymous" ? undefined : await sessionFor(who as Exclude<Who, "anonymous">);
        const res = await call(route.handler, route.path, { cookie });
        expect(res.status).toBe(allowed ? 200 : who === "anonymous" ? 401 : 403);
        if (!allowed) {
          const body = await res.json();
          expect(body.error.code).toBe(who === "anonymous" ? "unauthenticated" : "forbidden");
        }
      });
    }
  }

  it("a carer sees only the patient who invited them", async () => {
    const res = await call(portalToday, "/api/portal/today", { cookie: await sessionFor("carer") });
    const body = await res.json();
    expect(body.patients).toHaveLength(1);
    expect(body.patients[0].patient.familyName).toBe("Pell");
  });

  it("a clinician's caseload holds only patients of their own teams", async () => {
    const ward = await (await call(caseload, "/api/caseload", { cookie: await sessionFor("wardNurse") })).json();
    const names = ward.rows.map((r: { name: string }) => r.name);
    // Maria is on Larch Ward's list; the Harbourside-only demo patients are not (other tests may add Larch patients).
    expect(names).toContain("Maria Popescu");
    for (const other of ["Arthur Pell", "Halina Nowak", "Yusuf Haddad", "Rosa Jiménez", "Imran Qureshi"]) expect(names).not.toContain(other);
  });
});
