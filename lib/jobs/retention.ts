import "server-only";
// Retention of closed records: a closed record stays read-only for the deployment's retention
// period (Settings), then this job removes it and leaves an audit event that says so — with a
// keyed hash of the health record number, never the number or the patient's id.
// Scheduled daily by pg-boss (lib/jobs/boss.ts, RETENTION_CRON); run once by hand with
// `npx tsx --conditions=react-server scripts/retention.ts`.
import { db } from "@/db";
import { listRecordsPastRetention, lockPatient, removePatientRecord } from "@/db/queries/admin-patients";
import { hashIdentifier } from "@/lib/admin/tokens";
import { audit } from "@/lib/audit";
import { getSettings } from "@/lib/settings";

export type RetentionResult = { retentionDays: number | null; removed: number; objectKeys: string[] };

export async function removeExpiredRecords({ now = new Date(), log = (m: string) => console.log(`[retention] ${m}`) }: { now?: Date; log?: (m: string) => void } = {}): Promise<RetentionResult> {
  const { retentionDays } = await getSettings();
  if (retentionDays === null) {
    log("no retention period is configured; nothing removed");
    return { retentionDays, removed: 0, objectKeys: [] };
  }
  const closedBefore = new Date(now.getTime() - retentionDays * 86_400_000);
  const due = await listRecordsPastRetention({ closedBefore });
  let removed = 0;
  const objectKeys: string[] = [];
  for (const { id } of due) {
    await db.transaction(async (tx) => {
      const row = await lockPatient({ patientId: id }, tx);
      // Re-checked under the lock: reopened or already removed meanwhile.
      if (!row?.closedAt || row.closedAt >= closedBefore) return;
      const result = await removePatientRecord({ patientId: id, userId: row.userId }, tx);
      await audit(
        {
          action: "retention.remove",
          via: "system",
          details: { hrnHash: hashIdentifier("hrn", row.hrn), closedAt: row.closedAt.toISOString(), retentionDays, uploads: result.objectKeys.length, rows: result.rows },
        },
        tx,
      );
      const counts = Object.entries(result.rows)
        .filter(([, n]) => n > 0)
        .map(([t, n]) => `${t} ${n}`)
        .join(", ");
      log(`removed the record ${hashIdentifier("hrn", row.hrn).slice(0, 12)}… closed ${row.closedAt.toISOString().slice(0, 10)}: ${counts}`);
      objectKeys.push(...result.objectKeys);
      removed++;
    });
  }
  // TODO(storage): delete `objectKeys` from the object store once lib/storage is on main.
  log(`removed ${removed} closed record(s) past ${retentionDays} days`);
  return { retentionDays, removed, objectKeys };
}
