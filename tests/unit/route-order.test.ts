// Every route about one patient settles access (401 → 403 → 404) before it validates the body or
// the query (400), so nobody learns anything from a validation answer about a record they cannot
// see. Read from the code, like the access matrix finds the routes on disk.
import { relative } from "node:path";
import { describe, expect, it } from "vitest";
import { repoRoot, sourceFiles, sourceText } from "../support/source-files";

const ACCESS = /\b(require(StaffPatientAccess|PatientAccess|CareTeam|CarerManager|AdminOfPatient|UploadAccess|PortalPatient|DiaryEntryRemover|AccessLogReader)|open(EpisodeRequest|PortalBody|PatientRecord))\(/;
const PARSE = /\b(parseJsonBody|parseInput)\(/;

const handlers = sourceFiles(`${repoRoot}/app/api`)
  .filter((f) => f.endsWith("route.ts"))
  .flatMap((f) =>
    [...sourceText(f).matchAll(/export const (GET|POST|PATCH|PUT|DELETE) = handle[\s\S]*?\n\}\);/g)].map((m) => ({ name: `${m[1]} ${relative(`${repoRoot}/app`, f)}`, body: m[0] })),
  );

describe("patient routes check access before they read input", () => {
  const patientHandlers = handlers.filter((h) => ACCESS.test(h.body));

  it("finds the patient routes", () => {
    expect(patientHandlers.length).toBeGreaterThan(30);
  });

  it.each(patientHandlers.map((h) => [h.name, h.body]))("%s", (_name, body) => {
    const parse = body.search(PARSE);
    if (parse >= 0) expect(body.search(ACCESS), "an access check comes before the first parse").toBeLessThan(parse);
  });
});
