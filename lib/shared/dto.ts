// The shapes pages and route handlers hand to components. Components take them from here, not
// from db/queries, so the UI depends on the services layer only (the data layer stays behind it).
export type { CaseloadPage, CaseloadRow } from "@/db/queries/caseload";
export type { OutboundMessageDto } from "@/db/queries/outbox";
export type { PassportOverview } from "@/db/queries/passports";
export type { PatientDetails } from "@/db/queries/patients";
export type { UploadDto } from "@/db/queries/uploads";
