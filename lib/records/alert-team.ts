import "server-only";
// Who hears of an alert (urgent or emergency check-in, alerting NEWS2), sees it on their caseload,
// may acknowledge it, and gets it again when nobody has: the ONE choice of recipients. Today that
// is every care-team organisation (ward or community team) of the patient, as the alert e-mail
// always went; when a lead team is chosen per patient (transfer of care), change it here.
import { db, type Executor } from "@/db";
import { getCareTeamOrganisations, type CareTeamOrganisation } from "@/db/queries/mail-context";

export async function alertTeams({ patientId }: { patientId: string }, tx: Executor = db): Promise<CareTeamOrganisation[]> {
  return getCareTeamOrganisations({ patientId }, tx);
}

/** Whether one of the viewer's organisations is among the patient's alert teams. */
export async function inAlertTeam({ patientId, organisationIds }: { patientId: string; organisationIds: string[] }, tx: Executor = db): Promise<boolean> {
  if (organisationIds.length === 0) return false;
  return (await alertTeams({ patientId }, tx)).some((o) => organisationIds.includes(o.id));
}
