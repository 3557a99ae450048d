import "server-only";
// A trial without catheter whose window passed with no outcome recorded: the patient may be in
// retention at home. The lead team (alertTeams) is told once, through the outbox, by the pg-boss
// schedule `twoc-overdue` (lib/jobs/boss.ts); the caseload shows the trial in red meanwhile.
import { db } from "@/db";
import { listOverdueTrials } from "@/db/queries/episodes";
import { trialClock } from "@/lib/clinical";
import { getTwocVoidWindowHours } from "@/lib/config/settings";
import { queueCareTeamAlert } from "@/lib/email/care-team-alert";
import { audit } from "./audit";

export async function sendOverdueTrialAlerts({ now = new Date(), log = () => {} }: { now?: Date; log?: (m: string) => void } = {}) {
  const hours = await getTwocVoidWindowHours();
  const due = await listOverdueTrials({ removedBy: new Date(now.getTime() - hours * 3_600_000) });
  let sent = 0;
  for (const trial of due) {
    const { voidBy } = trialClock(trial.removedAt, now, hours);
    await db.transaction(async (tx) => {
      const queued = await queueCareTeamAlert(tx, {
        patientId: trial.patientId,
        kind: "twoc-overdue",
        level: "overdue",
        summary: "",
        sourceId: trial.episodeId,
        trial: { removedAt: trial.removedAt, voidBy },
      });
      if (!queued.some((m) => m.created)) return;
      await audit(
        { action: "twoc.overdue-alert", patientId: trial.patientId, via: "system", details: { episodeId: trial.episodeId, hours, messages: queued.map((m) => m.id) } },
        tx,
      );
      sent++;
    });
  }
  if (sent) log(`trials without catheter overdue: ${sent} lead teams told`);
  return { sent };
}
