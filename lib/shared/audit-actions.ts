// Audit action codes ("patient.view.history") in words. Codes use dots, which next-intl reads as
// nesting, so they are looked up with underscores: PatientAccessLog.actions for what is done to a
// patient's record, AdminAudit.actions for the rest (admin work, the caseload, sign-in).
export function actionMessageKey(action: string): string {
  return action.replace(/[^a-zA-Z0-9]/g, "_");
}

/** How a person reached the record ("short_code": the passport's code typed, not its QR scanned). */
export const AUDIT_VIA = ["care_team", "visit_access", "qr", "short_code", "self", "carer", "admin", "system"] as const;
