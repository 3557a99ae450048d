import "server-only";
// Who hears of an alert (urgent or emergency check-in, alerting NEWS2), sees it on their caseload,
// may acknowledge it, and gets it again when nobody has: the ONE choice of recipients. It is the
// patient's lead team (transfer of care: the team the patient is told to call); a record with no
// lead among its teams falls back to every care-team organisation, so no alert goes nowhere.
import { db, readTogether, type Executor } from "@/db";
import { getLeadTeamContact } from "@/db/queries/contacts";
import { getCareTeamOrganisations, type CareTeamOrganisation } from "@/db/queries/mail-context";

export async function alertTeams({ patientId }: { patientId: string }, tx: Executor = db): Promise<CareTeamOrganisation[]> {
  const [teams, lead] = await readTogether(tx, () => getCareTeamOrganisations({ patientId }, tx), () => getLeadTeamContact({ patientId }, tx));
  const leadTeam = lead ? teams.filter((o) => o.id === lead.organisationId) : [];
  return leadTeam.length ? leadTeam : teams;
}

/** Whether one of the viewer's organisations is among the patient's alert teams. */
export async function inAlertTeam({ patientId, organisationIds }: { patientId: string; organisationIds: string[] }, tx: Executor = db): Promise<boolean> {
  if (organisationIds.length === 0) return false;
  return (await alertTeams({ patientId }, tx)).some((o) => organisationIds.includes(o.id));
}
