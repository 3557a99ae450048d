// The access matrix (OWASP ASVS 8.2.1 function level, 8.2.2 data level, 8.4.1 tenants): every
// route handler × every persona, against Arthur Pell's record (care team: Harbourside; carer:
// Joan Pell). Each cell is the status that persona must get. "allowed" means access was granted
// and the request went on to validation or to the handler (any status but 401/403/404).
import type { Method } from "../../support/routes";

export const personas = [
  "anonymous",
  "admin",
  "careTeamClinician",
  "otherClinician",
  "patient",
  "otherPatient",
  "carer",
] as const;
export type Persona = (typeof personas)[number];
export type Cell = 401 | 403 | 404 | 200 | "allowed";
export type Expectations = Record<Persona, Cell>;

export type Fixture = { patientId: string; otherPatientId: string };

export type Row =
  | {
      route: `${Method} /api/${string}`;
      params?: (f: Fixture) => Record<string, string>;
      /** Query string for GET rows. */
      query?: string;
      expect: Expectations;
    }
  | { route: `${Method} /api/${string}`; exempt: string };

// Common shapes.
const staffOnPatient: Expectations = {
  anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: 404, patient: 403, otherPatient: 403, carer: 403,
};
const clinicianOnly: Expectations = {
  anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: "allowed", patient: 403, otherPatient: 403, carer: 403,
};
const adminOnly: Expectations = {
  anonymous: 401, admin: "allowed", careTeamClinician: 403, otherClinician: 403, patient: 403, otherPatient: 403, carer: 403,
};
const portalOnly: Expectations = {
  anonymous: 401, admin: 403, careTeamClinician: 403, otherClinician: 403, patient: "allowed", otherPatient: "allowed", carer: "allowed",
};
const anyoneSignedIn: Expectations = {
  anonymous: 401, admin: 200, careTeamClinician: 200, otherClinician: 200, patient: 200, otherPatient: 200, carer: 200,
};

export const shapes = { staffOnPatient, clinicianOnly, adminOnly, portalOnly, anyoneSignedIn };

const patient = (f: Fixture) => ({ patientId: f.patientId });

export const matrix: Row[] = [
  { route: "GET /api/auth/[...all]", exempt: "better-auth's own handler; sign-in, sessions and limits are tested in auth.test.ts" },
  { route: "POST /api/auth/[...all]", exempt: "better-auth's own handler; sign-in, sessions and limits are tested in auth.test.ts" },
  { route: "GET /api/me", expect: anyoneSignedIn },
  { route: "GET /api/caseload", expect: clinicianOnly },
  { route: "GET /api/admin/organisations", expect: adminOnly },
  { route: "GET /api/portal/today", expect: portalOnly },
  { route: "POST /api/patients/[patientId]/episodes", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/change", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/removal", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/twoc", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/check", params: patient, expect: staffOnPatient },
  // Any clinician may ask, holding the passport's token; the grant itself is tested in passport-card.test.ts.
  { route: "POST /api/visit-access", expect: clinicianOnly },
];

export { patient as patientParams };
