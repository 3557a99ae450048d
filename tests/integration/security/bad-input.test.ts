// Property-based bad input on every route handler under app/api that takes a body (POST, PUT,
// PATCH), found on disk like the access matrix, as a persona the matrix lets through: arbitrary
// JSON, wrong types, huge strings, deep nesting, non-JSON and wrong content types → always a 4xx
// in the project's error shape, never a 5xx, and nothing written to any table (audit events
// included: refusals are not audited). ASVS 2.2.1, 2.2.2, 5.2.1, 16.5.1.
import fc from "fast-check";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db";
import { episodeEvents } from "@/db/schema";
import { errorStatus } from "@/lib/http/errors";
import { changedTables, databaseTables, schemaTables, snapshot } from "../../support/db-snapshot";
import { call, sessionFor } from "../../support/http";
import { fillPattern, listRouteFiles, type Method } from "../../support/routes";
import { matrix, type Fixture, type Persona } from "./access-matrix";
import { securityFixture } from "./fixture";
import { badBodies, overrides, schemaFieldNames, type BadBody, type BadInputOverride } from "./bad-input";
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

// Watch the project's one body parser: whether a route reached it, and whether the route's own
// schema accepted the body (then it was not bad input after all, and may be written).
const parser = vi.hoisted(() => ({ calls: 0, accepted: 0 }));
vi.mock("@/lib/http/validate", async (importOriginal) => {
  const actual = await importOriginal<typeof import("@/lib/http/validate")>();
  return {
    ...actual,
    parseJsonBody: async (...args: Parameters<typeof actual.parseJsonBody>) => {
      parser.calls++;
      const out = await actual.parseJsonBody(...args);
      parser.accepted++;
      return out;
    },
  };
});

const bodyMethods = ["POST", "PUT", "PATCH"] as const satisfies readonly Method[];
const RUNS = Number(process.env.BAD_INPUT_RUNS ?? 30);
const personaAccount: Record<Exclude<Persona, "anonymous">, Parameters<typeof sessionFor>[0]> = {
  admin: "admin",
  careTeamClinician: "communityNurse",
  otherClinician: "wardNurse",
  patient: "patient",
  otherPatient: "patientAr",
  carer: "carer",
};
// The persona to send as, when the matrix lets several through.
const preference: Persona[] = ["careTeamClinician", "patient", "carer", "admin", "otherClinician", "otherPatient", "anonymous"];

type Handler = (req: Request, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;
type Target = { key: string; pattern: string; method: Method; handler: Handler; plan?: BadInputOverride; why?: string };

let fixture: Fixture;
let ids: string[];

/** How the suite drives a body route: from its matrix row, or from an override. */
function planFor(key: string): { plan?: BadInputOverride; why?: string } {
  if (overrides[key]) return { plan: overrides[key] };
  const row = matrix.find((r) => r.route === key);
  if (!row) return { why: "no access-matrix row" };
  if ("exempt" in row) return { why: `matrix row is exempt (${row.exempt}) and there is no override in bad-input.ts` };
  const persona = preference.find((p) => row.expect[p] === "allowed");
  if (!persona) return { why: "the matrix lets no persona through; add an override in bad-input.ts" };
  return { plan: { persona, params: row.params ? (f) => row.params!({ ...fixture, ...f }) : undefined } };
}

function seedFor(key: string) {
  let h = 2166136261;
  for (const c of key) h = Math.imul(h ^ c.charCodeAt(0), 16777619);
  return h >>> 0;
}

// Found at collection time, so each body route on disk gets a test of its own.
const targets: Target[] = [];
for (const { pattern, file } of listRouteFiles()) {
  const mod = (await import(file)) as Record<string, unknown>;
  for (const m of bodyMethods) {
    if (typeof mod[m] !== "function") continue;
    const key = `${m} ${pattern}`;
    targets.push({ key, pattern, method: m, handler: mod[m] as Handler, ...planFor(key) });
  }
}

/** fast-check's report without the (possibly 300 kB) counterexample body. */
function shortReport(details: fc.RunDetails<[BadBody, string]>) {
  if (!details.failed) return;
  const [body, path] = details.counterexample ?? [];
  const cause = details.errorInstance instanceof Error ? details.errorInstance.message : String(details.errorInstance);
  throw new Error(
    `bad input failed after ${details.numRuns} runs (seed ${details.seed}, path "${details.counterexamplePath}"): ` +
      `${path} ${body?.label} [${body?.contentType ?? "application/json"}] ${body?.rawBody.length} chars: ${body?.rawBody.slice(0, 300)}\n${cause.slice(0, 1500)}`,
  );
}

beforeAll(async () => {
  fixture = await securityFixture();
  ids = [fixture.patientId, fixture.otherPatientId];
});

describe("bad input on every route that takes a body", () => {
  it("finds the body routes on disk and has a way to drive each one", () => {
    expect(targets.length).toBeGreaterThan(10);
    expect(targets.filter((t) => !t.plan).map((t) => `${t.key}: ${t.why}`), "body routes the suite cannot drive").toEqual([]);
  });

  it("fingerprints every table of the database (db/schema declares them all)", async () => {
    expect(await databaseTables()).toEqual(schemaTables);
  });

  // Every route that reads its body through lib/validate refuses a control character in any
  // string, named by its field, whatever the route's own schema holds (NUL gave a 500 before).
  for (const target of targets) {
    if (target.plan?.ownParser || target.plan?.noBody) continue;
    it(`${target.key} refuses a NUL or a control character in every field with a field error, and writes nothing`, async () => {
      const plan = target.plan!;
      const params = plan.params ? plan.params({ patientId: fixture.patientId, incomingReferralId: fixture.incomingReferralId }) : {};
      const path = (plan.paths ?? [fillPattern(target.pattern, params)])[0];
      const cookie = plan.persona === "anonymous" ? undefined : await sessionFor(personaAccount[plan.persona]);
      const fields = schemaFieldNames();
      const before = await snapshot();
      for (const bad of ["Pell\u0000", "FUZZ\u001b[31m", "a\u0008b"]) {
        const body = Object.fromEntries(fields.map((f) => [f, bad]));
        const res = await call(target.handler, path, { method: target.method, cookie, params, body, headers: { [CLIENT_ADDRESS_HEADER]: "10.78.0.1" } });
        expect(res.status, await res.clone().text()).toBe(400);
        const { error } = (await res.json()) as { error: { code: string; fields: Record<string, string[]> } };
        expect(error.code).toBe("validation_failed");
        for (const f of fields) expect(error.fields[f], f).toContain("control_character");
      }
      expect(changedTables(before, await snapshot(), plan.mayWrite), "nothing written").toEqual([]);
    });
  }

  // One test per body route on disk: a route added later is covered without editing this file.
  for (const target of targets) {
    const { key, method } = target;
    it(`${key} refuses bad bodies with a 4xx, never a 5xx, and writes nothing`, { timeout: 240_000 }, async () => {
        expect(target.plan, target.why).toBeTruthy();
        const plan = target.plan!;
        const params = plan.params ? plan.params({ patientId: fixture.patientId, incomingReferralId: fixture.incomingReferralId }) : {};
        const paths = plan.paths ?? [fillPattern(target.pattern, params)];
        const cookie = plan.persona === "anonymous" ? undefined : await sessionFor(personaAccount[plan.persona]);
        const fields = schemaFieldNames();
        let n = 0;
        let before = await snapshot();
        const callsAtStart = parser.calls;
        let acceptedBodies = 0;

        await fc.assert(
          fc.asyncProperty(badBodies(fields, ids), fc.constantFrom(...paths), async (body, path) => {
            const headers: Record<string, string> = { [CLIENT_ADDRESS_HEADER]: `10.77.${Math.floor(n / 250) % 250}.${n++ % 250}` };
            if (body.contentType === undefined) headers["content-type"] = "application/json";
            else if (body.contentType !== "") headers["content-type"] = body.contentType;
            const accepted = parser.accepted;
            const res = await call(target.handler, path, { method, cookie, params, rawBody: body.rawBody, headers });
            const text = await res.text();
            expect(res.status, `${body.label}: never a server error (${text.slice(0, 200)})`).toBeLessThan(500);
            if (parser.accepted > accepted) {
              // The route's own schema took it: valid after all, so it may be written.
              acceptedBodies++;
              before = await snapshot();
              return;
            }
            expect(res.status, `${body.label}: refused`).toBeGreaterThanOrEqual(400);
            if (!plan.ownParser) {
              const json = JSON.parse(text) as { error?: { code?: string; message?: string } };
              expect(typeof json.error?.message, "error shape { error: { code, message } }").toBe("string");
              expect(errorStatus[json.error!.code as keyof typeof errorStatus], `code ${json.error?.code} matches the status`).toBe(res.status);
              expect(res.headers.get("cache-control")).toContain("no-store");
            }
            const after = await snapshot();
            expect(changedTables(before, after, plan.mayWrite), `${body.label}: nothing written`).toEqual([]);
            before = after;
          }),
          { numRuns: RUNS, seed: seedFor(key), endOnFailure: true, reporter: shortReport },
        );
        if (!plan.ownParser && !plan.noBody) {
          // The route read its body through lib/validate, so the refusals above were its parser's.
          expect(parser.calls - callsAtStart, "the route reached parseJsonBody").toBeGreaterThan(0);
        }
        // A generator that mostly produced valid bodies would prove little.
        expect(acceptedBodies, "bodies the schema accepted").toBeLessThanOrEqual(Math.ceil(RUNS / 10));
    });
  }
});

// The three places a NUL gave a 500, and the upload label once shown as "FUZZ exe.png": real
// bodies, otherwise valid, each refused on its field; notes keep their line breaks.
describe("text with control and bidirectional characters, in otherwise valid bodies", () => {
  const route = (key: string) => targets.find((t) => t.key === key)!;
  const send = async (key: string, body: unknown, who: Persona = "careTeamClinician") => {
    const t = route(key);
    const params = { patientId: fixture.patientId };
    return call(t.handler, fillPattern(t.pattern, params), { method: t.method, cookie: await sessionFor(personaAccount[who as Exclude<Persona, "anonymous">]), params, body });
  };
  const supply = (note: string) => ({ periodDays: 28, include: { legBag: true, valve: false, nightBag: true, gel: false }, items: [{ item: "catheter", quantity: 2 }], note });

  it("PATCH patient, supply-request note, upload label: a NUL is a 400 on that field, nothing written", async () => {
    await sessionFor("communityNurse");
    const before = await snapshot();
    const cases: [string, unknown, string][] = [
      ["PATCH /api/patients/[patientId]", { familyName: "Pell\u0000" }, "familyName"],
      ["POST /api/patients/[patientId]/supply-requests", supply("Two spare\u0000 please"), "note"],
      ["POST /api/patients/[patientId]/uploads", { category: "site-photo", label: "Site\u0000", contentType: "image/png", sizeBytes: 2048 }, "label"],
    ];
    for (const [key, body, field] of cases) {
      const res = await send(key, body);
      expect(res.status, key).toBe(400);
      expect((await res.json()).error.fields[field], key).toContain("control_character");
    }
    expect(changedTables(before, await snapshot())).toEqual([]);
  });

  it("a bidirectional override is refused in names and labels; line breaks are refused in a name and kept in a note", async () => {
    await sessionFor("communityNurse");
    const before = await snapshot();
    const label = await send("POST /api/patients/[patientId]/uploads", { category: "site-photo", label: "FUZZ\u202Egnp.exe", contentType: "image/png", sizeBytes: 2048 });
    expect((await label.json()).error.fields.label).toEqual(["bidi_control"]);
    const name = await send("PATCH /api/patients/[patientId]", { givenName: "Art\u2066hur", familyName: "Pell\nSmith" });
    const fields = (await name.json()).error.fields;
    expect(fields.givenName).toEqual(["bidi_control"]);
    expect(fields.familyName).toEqual(["one_line"]);
    expect(changedTables(before, await snapshot())).toEqual([]);
    // Right-to-left marks are part of writing Arabic and Urdu, not overrides: kept.
    const rlm = await send("PATCH /api/patients/[patientId]", { allergies: { latex: "yes", chlorhexidine: "no", lidocaine: "no", other: "بنسلين\u200F" } });
    expect(rlm.status).toBe(200);
    const notes = "Bag emptied at 06:00.\n\tSite clean, no redness.";
    const visit = await send("POST /api/patients/[patientId]/visits", { occurredAt: new Date(Date.now() - 60_000).toISOString(), notes });
    expect(visit.status, await visit.clone().text()).toBe(201);
    const [event] = await db.select({ notes: episodeEvents.notes }).from(episodeEvents).where(eq(episodeEvents.id, (await visit.json()).eventId));
    expect(event.notes).toBe(notes);
  });
});
