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

export type Fixture = {
  patientId: string;
  otherPatientId: string;
  /** A finished upload on Arthur's record. */
  uploadId: string;
  /** Harbourside (Arthur's care team; the demo admin belongs to it). */
  organisationId: string;
  /** Grace Mensah, a clinician of Harbourside. */
  staffUserId: string;
  /** The demo admin themselves (deactivating oneself is refused, so the matrix changes nothing). */
  adminUserId: string;
  /** Priya Sandhu (Rowan Ward, the admin manages it), who plays no persona: signing her out changes no other row. */
  bystanderStaffUserId: string;
  /** An open NEWS2 alert to acknowledge on Arthur's record (an empty body is refused: it names no action). */
  caseloadItemId: string;
  /** A pending referral of Arthur from Harbourside to Rowan Ward (no persona belongs to Rowan Ward). */
  referralId: string;
  /** A pending referral of Arthur to Harbourside (for the bad-input suite's answering nurse). */
  incomingReferralId: string;
};

export type Row =
  | {
      route: `${Method} /api/${string}`;
      params?: (f: Fixture) => Record<string, string>;
      /** Query string for GET rows. */
      query?: string | ((f: Fixture) => string);
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

const patient = (f: Fixture) => ({ patientId: f.patientId });
// Answering a referral is for the receiving team alone: the fixture's goes to Rowan Ward, which no
// persona belongs to, so every clinician is refused as if it did not exist (the allowed case, the
// receiving nurse, is in tests/integration/transfer-of-care.test.ts).
const referralReceiverOnly: Expectations = {
  anonymous: 401, admin: 403, careTeamClinician: 404, otherClinician: 404, patient: 403, otherPatient: 403, carer: 403,
};
const upload = (f: Fixture) => ({ patientId: f.patientId, uploadId: f.uploadId });

export const matrix: Row[] = [
  { route: "GET /api/auth/[...all]", exempt: "better-auth's own handler; sign-in, sessions and limits are tested in auth.test.ts" },
  { route: "POST /api/auth/[...all]", exempt: "better-auth's own handler; sign-in, sessions and limits are tested in auth.test.ts" },
  { route: "GET /api/me", expect: anyoneSignedIn },
  // A person's own sessions (tests/integration/sessions.test.ts: another person's session is 404).
  { route: "GET /api/account/sessions", expect: anyoneSignedIn },
  // Easier reading: a patient's or carer's own text size and contrast (tests/integration/reading-comfort.test.ts).
  { route: "GET /api/account/reading", expect: portalOnly },
  { route: "PUT /api/account/reading", expect: portalOnly },
  { route: "GET /api/account/push", expect: portalOnly },
  { route: "POST /api/account/push", expect: portalOnly },
  { route: "DELETE /api/account/push", expect: portalOnly },
  { route: "GET /api/account/reach", expect: portalOnly },
  { route: "PUT /api/account/reach", expect: portalOnly },
  { route: "DELETE /api/account/sessions", expect: anyoneSignedIn },
  {
    route: "DELETE /api/account/sessions/[sessionId]",
    params: () => ({ sessionId: "not-a-session-of-theirs-0000" }),
    expect: { anonymous: 401, admin: 404, careTeamClinician: 404, otherClinician: 404, patient: 404, otherPatient: 404, carer: 404 },
  },
  { route: "GET /api/caseload", expect: clinicianOnly },
  { route: "GET /api/admin/organisations", expect: adminOnly },
  { route: "GET /api/portal/today", expect: portalOnly },
  // The booklet of Arthur for the portal (tests/integration/portal-booklet.test.ts): himself and his carer.
  {
    route: "GET /api/portal/booklet",
    query: (f) => `patient=${f.patientId}`,
    expect: { anonymous: 401, admin: 403, careTeamClinician: 403, otherClinician: 403, patient: 200, otherPatient: 404, carer: 200 },
  },
  // Listen: speech for a sentence of a portal page, patients and carers only (tests/integration/speech.test.ts).
  { route: "GET /api/speech", query: "lang=en&text=Drink%20water.", expect: portalOnly },
  // Portal (patients and carers); the data-level cases (other patient 404, revoked carer 404)
  // are in tests/integration/portal-api.test.ts, which sends real bodies.
  { route: "POST /api/check-ins", expect: portalOnly },
  { route: "GET /api/diary", expect: portalOnly },
  { route: "POST /api/diary", expect: portalOnly },
  {
    route: "DELETE /api/diary/[id]",
    params: () => ({ id: "00000000-0000-4000-8000-000000000000" }),
    expect: { anonymous: 401, admin: 403, careTeamClinician: 403, otherClinician: 403, patient: 404, otherPatient: 404, carer: 404 },
  },
  { route: "POST /api/bag-changes", expect: portalOnly },
  // A carer's own choice to be told of urgent check-ins: carers only.
  {
    route: "PUT /api/portal/carer-alerts",
    expect: { anonymous: 401, admin: 403, careTeamClinician: 403, otherClinician: 403, patient: 403, otherPatient: 403, carer: "allowed" },
  },
  // Public by design: a code or token is the proof; limited per address (lib/http/rate-limit.ts).
  { route: "POST /api/activate", expect: { anonymous: "allowed", admin: "allowed", careTeamClinician: "allowed", otherClinician: "allowed", patient: "allowed", otherPatient: "allowed", carer: "allowed" } },
  { route: "POST /api/carer-invites/accept", expect: { anonymous: "allowed", admin: "allowed", careTeamClinician: "allowed", otherClinician: "allowed", patient: "allowed", otherPatient: "allowed", carer: "allowed" } },
  { route: "POST /api/patients/[patientId]/invite", params: patient, expect: staffOnPatient },
  {
    route: "POST /api/patients/[patientId]/carers",
    params: patient,
    expect: { anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: 404, patient: "allowed", otherPatient: 404, carer: 403 },
  },
  {
    route: "DELETE /api/patients/[patientId]/carers/[linkId]",
    params: (f) => ({ patientId: f.patientId, linkId: "not-a-link" }),
    expect: { anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: 404, patient: "allowed", otherPatient: 404, carer: 403 },
  },
  { route: "POST /api/patients/[patientId]/episodes", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/change", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/removal", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/twoc", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/twoc-plan", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/follow-up-review", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/episodes/check", params: patient, expect: staffOnPatient },
  // Clinician workspace: caseload export, registration, the record's details, history, access log.
  { route: "GET /api/caseload/export", expect: clinicianOnly },
  {
    route: "GET /api/gp-practices",
    expect: { anonymous: 401, admin: "allowed", careTeamClinician: "allowed", otherClinician: "allowed", patient: 403, otherPatient: 403, carer: 403 },
  },
  { route: "POST /api/patients", expect: clinicianOnly },
  { route: "GET /api/patients/[patientId]", params: patient, expect: staffOnPatient },
  { route: "PATCH /api/patients/[patientId]", params: patient, expect: staffOnPatient },
  { route: "GET /api/patients/[patientId]/history", params: patient, expect: staffOnPatient },
  // Who looked at the record: the care team and the patient themselves; carers and admins 403.
  {
    route: "GET /api/patients/[patientId]/access-log",
    params: patient,
    expect: { anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: 404, patient: "allowed", otherPatient: 404, carer: 403 },
  },
  // Passport: issue/reissue, metadata, the stored booklet. The POST row comes first, so the
  // booklet row finds a passport to download (rows run in order).
  { route: "POST /api/patients/[patientId]/passport", params: patient, expect: staffOnPatient },
  // Transfer of care: the directory, referrals, the care team's changes, the discharge checklist.
  // The care team's own acts refuse visit access too (transfer-of-care.test.ts sends real bodies).
  { route: "GET /api/teams", expect: clinicianOnly },
  { route: "GET /api/patients/[patientId]/referrals", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/referrals", params: patient, expect: staffOnPatient },
  { route: "POST /api/referrals/[referralId]/accept", params: (f) => ({ referralId: f.referralId }), expect: referralReceiverOnly },
  { route: "POST /api/referrals/[referralId]/decline", params: (f) => ({ referralId: f.referralId }), expect: referralReceiverOnly },
  // After the answers' rows: the care team withdraws the fixture referral.
  { route: "POST /api/patients/[patientId]/referrals/[referralId]/withdraw", params: (f) => ({ patientId: f.patientId, referralId: f.referralId }), expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/care-team", params: patient, expect: staffOnPatient },
  { route: "PATCH /api/patients/[patientId]/care-team", params: patient, expect: staffOnPatient },
  { route: "DELETE /api/patients/[patientId]/care-team/[organisationId]", params: (f) => ({ patientId: f.patientId, organisationId: f.organisationId }), expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/discharge-checklist", params: patient, expect: staffOnPatient },
  { route: "GET /api/patients/[patientId]/passport", params: patient, expect: staffOnPatient },
  { route: "GET /api/patients/[patientId]/passport/pdf", params: patient, expect: staffOnPatient },
  // Uploads: staff list and download; the patient and a linked carer may add site photos.
  { route: "GET /api/patients/[patientId]/uploads", params: patient, expect: staffOnPatient },
  {
    route: "POST /api/patients/[patientId]/uploads",
    params: patient,
    expect: { anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: 404, patient: "allowed", otherPatient: 404, carer: "allowed" },
  },
  {
    // The fixture upload was started by the care team: the patient and carer finish only their own.
    route: "POST /api/patients/[patientId]/uploads/[uploadId]/complete",
    params: upload,
    expect: { anonymous: 401, admin: 403, careTeamClinician: "allowed", otherClinician: 404, patient: 404, otherPatient: 404, carer: 404 },
  },
  { route: "GET /api/patients/[patientId]/uploads/[uploadId]/file", params: upload, expect: staffOnPatient },
  // Last of the upload rows: the care team's call removes the fixture file.
  { route: "DELETE /api/patients/[patientId]/uploads/[uploadId]", params: upload, expect: staffOnPatient },
  { route: "GET /api/patients/[patientId]/messages", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/messages/[messageId]/resend", exempt: "needs a message of the patient: its full matrix is in letters-supplies.test.ts" },
  { route: "GET /api/patients/[patientId]/supply-requests", params: patient, expect: staffOnPatient },
  { route: "POST /api/patients/[patientId]/supply-requests", params: patient, expect: staffOnPatient },
  // Organisation administration (issue 9).
  { route: "POST /api/admin/organisations", expect: adminOnly },
  { route: "GET /api/admin/organisations/[organisationId]", params: (f) => ({ organisationId: f.organisationId }), expect: adminOnly },
  { route: "PATCH /api/admin/organisations/[organisationId]", params: (f) => ({ organisationId: f.organisationId }), expect: adminOnly },
  { route: "GET /api/admin/settings", expect: adminOnly },
  { route: "PATCH /api/admin/settings", expect: adminOnly },
  { route: "GET /api/admin/staff", expect: adminOnly },
  { route: "POST /api/admin/staff/invitations", expect: adminOnly },
  {
    route: "DELETE /api/admin/staff/invitations/[invitationId]",
    params: () => ({ invitationId: "00000000-0000-4000-8000-000000000000" }),
    expect: { ...adminOnly, admin: 404 },
  },
  { route: "GET /api/admin/staff/[userId]", params: (f) => ({ userId: f.staffUserId }), expect: adminOnly },
  { route: "PATCH /api/admin/staff/[userId]", params: (f) => ({ userId: f.staffUserId }), expect: adminOnly },
  { route: "POST /api/admin/staff/[userId]/deactivate", params: (f) => ({ userId: f.adminUserId }), expect: adminOnly },
  { route: "POST /api/admin/staff/[userId]/sign-out", params: (f) => ({ userId: f.bystanderStaffUserId }), expect: adminOnly },
  { route: "POST /api/admin/staff/[userId]/reactivate", params: (f) => ({ userId: f.adminUserId }), expect: adminOnly },
  {
    route: "POST /api/staff-invitations/accept",
    // Public: the token in the body is the authority; an empty body is a 400 for everyone.
    expect: { anonymous: "allowed", admin: "allowed", careTeamClinician: "allowed", otherClinician: "allowed", patient: "allowed", otherPatient: "allowed", carer: "allowed" },
  },
  { route: "GET /api/admin/audit", expect: adminOnly },
  { route: "GET /api/admin/audit/export", expect: adminOnly },
  { route: "GET /api/admin/patients", expect: adminOnly },
  { route: "POST /api/admin/patients/[patientId]/close", params: patient, expect: adminOnly },
  {
    route: "GET /api/patients/[patientId]/export",
    params: patient,
    expect: { anonymous: 401, admin: "allowed", careTeamClinician: 403, otherClinician: 403, patient: "allowed", otherPatient: 404, carer: 403 },
  },
  // Any clinician may ask, holding the passport's token; the grant itself is tested in passport-card.test.ts.
  { route: "POST /api/visit-access", expect: clinicianOnly },
  // Visits with NEWS2 and the FHIR export: the care team or visit access (issue 5's own matrix,
  // before and after a reason, is in visit-access-matrix.test.ts).
  { route: "POST /api/patients/[patientId]/visits", params: patient, expect: staffOnPatient },
  { route: "GET /api/patients/[patientId]/fhir", params: patient, expect: staffOnPatient },
  // Acknowledging an alert: the care team only (visit access is not enough: 403, in
  // caseload-items.test.ts), and then only the team the alert went to (lib/records/alert-team.ts).
  {
    route: "POST /api/patients/[patientId]/caseload-items/[itemId]",
    params: (f) => ({ patientId: f.patientId, itemId: f.caseloadItemId }),
    expect: staffOnPatient,
  },
];
