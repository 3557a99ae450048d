// Which message namespaces each part of the app sends to the browser. Server components read the
// whole catalogue on the server; only client components need messages in the page, and sending
// all of them made every page ~125 KB. tests/unit/i18n-client-namespaces.test.ts walks the
// imports and fails when a client component reads a namespace its scope does not send.
export const clientNamespaces = {
  /** Every page: the root error boundary. */
  root: ["Errors"],
  auth: ["AcceptInvite", "Activate", "CarerInvite", "Common", "Password", "PasswordReset", "SignIn", "SignOut", "TwoFactor"],
  portal: ["Account", "CheckIn", "Common", "Diary", "Listen", "More", "MyCatheter", "Password", "People", "Pictures", "Portal", "PortalReach", "Reading", "Reminders", "Sessions", "Today", "TwoFactor", "Uploads"],
  staff: [
    "Account", "Admin", "AdminOrganisations", "AdminPatients", "AdminSettings", "AdminStaff", "Caseload", "CaseloadState",
    "CareLoop", "Common", "EpisodeForm", "Letters", "Passport", "Password", "PatientDevice", "PatientForm", "PatientRecord",
    "PortalInvite", "Scan", "Sessions", "Supplies", "Transfer", "TranslationReview", "Twoc", "TwoFactor", "Uploads", "VisitForm", "Visits", "Vocabulary",
  ],
  /** The public device card and short-code pages, and the clinician's visit sign-in. */
  card: ["Password", "SignIn", "TwoFactor", "VisitAccess"],
} as const satisfies Record<string, readonly string[]>;

export type ClientScope = keyof typeof clientNamespaces;
