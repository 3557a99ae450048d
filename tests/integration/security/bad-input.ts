// Hostile request bodies for the property-based bad-input suite (ASVS 2.2.1 allow-list
// validation on the server, 5.2.1 size limits, 16.5.1 generic errors). Every body here is meant
// to be refused; the suite checks the route's own parser agreed that it was bad.
import fs from "node:fs";
import path from "node:path";
import fc from "fast-check";
import type { Persona } from "./access-matrix";

/** Field names the project's zod schemas use, read from lib/validations, so fuzzed objects hit real fields. */
export function schemaFieldNames(): string[] {
  const dir = path.resolve(__dirname, "../../../lib/validations");
  const names = new Set<string>();
  for (const file of fs.readdirSync(dir)) {
    const text = fs.readFileSync(path.join(dir, file), "utf8");
    for (const m of text.matchAll(/^\s{2,}(\w+)\s*:/gm)) names.add(m[1]);
  }
  // zod option keys, not fields.
  for (const k of ["error", "message", "path", "offset"]) names.delete(k);
  return [...names].sort();
}

export type BadBody = { label: string; rawBody: string; contentType?: string };

function nested(depth: number, kind: "array" | "object") {
  return kind === "array" ? "[".repeat(depth) + "]".repeat(depth) : '{"a":'.repeat(depth) + "1" + "}".repeat(depth);
}

/**
 * Bodies a schema must refuse whatever its fields: values of the wrong type, huge, deeply nested,
 * not JSON, too large, or sent with the wrong content type. `ids` are real record ids, mixed in
 * so that a lookup by id can succeed and validation is reached.
 */
export function badBodies(fields: string[], ids: string[]): fc.Arbitrary<BadBody> {
  const huge = fc.integer({ min: 5_000, max: 60_000 }).map((n) => "ß".repeat(Math.floor(n / 2)));
  const deep = fc.tuple(fc.integer({ min: 50, max: 3_000 }), fc.constantFrom("array" as const, "object" as const));
  const hostileString = fc.oneof(
    fc.string(),
    fc.constantFrom("", " ", "\u0000", "null", "NaN", "1e309", "' or 1=1 --", "<script>alert(1)</script>", "../../etc/passwd", "\u202e", "𝔘𝔫𝔦𝔠𝔬𝔡𝔢", ...ids),
    huge,
  );
  const wrongValue: fc.Arbitrary<unknown> = fc.oneof(
    fc.jsonValue({ maxDepth: 3 }),
    hostileString,
    fc.double(),
    fc.constantFrom(Number.MAX_SAFE_INTEGER + 2, -0, 1e308, -1e308, true, false, null, [], {}),
    fc.array(hostileString, { maxLength: 50 }),
    deep.map(([d, k]) => JSON.parse(nested(d, k)) as unknown),
    fc.dictionary(fc.constantFrom(...fields), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 4 }),
  );
  const json = (label: string) => (v: unknown): BadBody => ({ label, rawBody: JSON.stringify(v) });
  // An object on the schema's field names in which at least one field holds something no
  // schema here accepts for it (a nested array of objects, or a body that is too long).
  const poisoned = fc
    .tuple(
      fc.dictionary(fc.constantFrom(...fields), wrongValue, { minKeys: 1, maxKeys: 8 }),
      fc.constantFrom(...fields),
      fc.constantFrom<unknown>([[{ a: [{}] }]], { $gt: "" }, [null, [null]], JSON.parse('{"__proto__":{"role":"admin"}}')),
    )
    .map(([obj, key, poison]) => ({ ...obj, [key]: poison }));
  return fc.oneof(
    // Not an object at all.
    fc.oneof(fc.constant(null), fc.boolean(), fc.double(), hostileString, fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 10 })).map(json("not an object")),
    fc.jsonValue({ maxDepth: 4 }).filter((v) => v === null || typeof v !== "object" || Array.isArray(v)).map(json("JSON that is not an object")),
    poisoned.map(json("schema fields with wrong types")),
    fc.dictionary(fc.constantFrom(...fields), wrongValue, { minKeys: 1, maxKeys: 12 }).map((o) => ({ ...o, [fields[0]]: [[[]]] })).map(json("wrong types, huge, nested")),
    deep.map(([d, k]) => ({ label: `nested ${d} deep`, rawBody: nested(d, k) })),
    fc.integer({ min: 65 * 1024, max: 300 * 1024 }).map((n) => ({ label: "too large", rawBody: JSON.stringify({ [fields[1]]: "x".repeat(n) }) })),
    fc.constantFrom("{", "}", "{'a': 1}", "undefined", "NaN", "{\"a\":1,}", "\u0000", "<xml/>", "a=1&b=2", "[1,2", "\"unterminated").map((raw) => ({ label: "not JSON", rawBody: raw })),
    fc.string({ minLength: 1 }).filter((s) => { try { JSON.parse(s); return false; } catch { return true; } }).map((raw) => ({ label: "not JSON", rawBody: raw })),
    fc
      .tuple(
        fc.constantFrom("text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "text/html", "application/xml", "", "application/jsonx"),
        fc.dictionary(fc.constantFrom(...fields), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 6 }),
      )
      .map(([contentType, v]) => ({ label: `content type "${contentType}"`, rawBody: JSON.stringify(v), contentType })),
  );
}

/**
 * Routes the access matrix cannot drive on its own (its row is exempt or lets nobody through).
 * A body route with neither an allowed persona in the matrix nor a row here fails the suite.
 */
export type BadInputOverride = {
  persona: Persona;
  params?: (ids: { patientId: string; incomingReferralId: string }) => Record<string, string | string[]>;
  /** Paths to send to (for a catch-all route); default: the pattern filled with params. */
  paths?: string[];
  /** Tables the route may write when it refuses, on purpose (e.g. a rate-limit counter). */
  mayWrite?: string[];
  /** The route reads no body through lib/validate: say why, and what it answers instead. */
  ownParser?: string;
  noBody?: string;
};

export const overrides: Record<string, BadInputOverride> = {
  "POST /api/auth/[...all]": {
    persona: "anonymous",
    paths: ["/api/auth/sign-in/email", "/api/auth/sign-up/email", "/api/auth/change-password", "/api/auth/update-user"],
    // better-auth counts every attempt, refused or not, in its rate_limit table; a well-formed
    // wrong password is a failed sign-in: counted for its account and audited (ASVS 16.3.1).
    mayWrite: ["rate_limit", "sign_in_throttles", "audit_events"],
    ownParser: "better-auth parses its own bodies and answers in its own error shape",
  },
  "POST /api/patients/[patientId]/messages/[messageId]/resend": {
    persona: "careTeamClinician",
    params: ({ patientId }) => ({ patientId, messageId: "00000000-0000-4000-8000-000000000000" }),
    noBody: "takes no body: the message is named in the path; a junk body must change nothing",
  },
  "POST /api/admin/staff/[userId]/deactivate": {
    persona: "admin",
    params: () => ({ userId: "no-such-user" }),
    noBody: "takes no body: the account is named in the path; a junk body must change nothing",
  },
  "POST /api/admin/staff/[userId]/sign-out": {
    persona: "admin",
    params: () => ({ userId: "no-such-user" }),
    noBody: "takes no body: the account is named in the path; a junk body must change nothing",
  },
  "POST /api/admin/staff/[userId]/reactivate": {
    persona: "admin",
    params: () => ({ userId: "no-such-user" }),
    noBody: "takes no body: the account is named in the path; a junk body must change nothing",
  },
  // Answering a referral is for the receiving team: the fixture's second referral goes to
  // Harbourside, so the care-team clinician (Harbourside) answers it.
  "POST /api/referrals/[referralId]/decline": {
    persona: "careTeamClinician",
    params: ({ incomingReferralId }) => ({ referralId: incomingReferralId }),
  },
  "POST /api/referrals/[referralId]/accept": {
    persona: "careTeamClinician",
    params: () => ({ referralId: "00000000-0000-4000-8000-000000000000" }),
    noBody: "takes no body: the referral is named in the path; a junk body must change nothing",
  },
  "POST /api/patients/[patientId]/referrals/[referralId]/withdraw": {
    persona: "careTeamClinician",
    params: ({ patientId }) => ({ patientId, referralId: "00000000-0000-4000-8000-000000000000" }),
    noBody: "takes no body: the referral is named in the path; a junk body must change nothing",
  },
  "POST /api/patients/[patientId]/uploads/[uploadId]/complete": {
    persona: "careTeamClinician",
    params: ({ patientId }) => ({ patientId, uploadId: "00000000-0000-4000-8000-000000000000" }),
    noBody: "takes no body: the upload is named in the path; a junk body must change nothing",
  },
};
