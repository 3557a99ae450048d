import "server-only";
// Retention of closed records: a closed record stays read-only for the deployment's retention
// period (Settings), then this job removes it and leaves an audit event that says so — with a
// keyed hash of the health record number, never the number or the patient's id.
// Scheduled daily by pg-boss (lib/jobs/boss.ts, RETENTION_CRON); run once by hand with
// `npx tsx --conditions=react-server scripts/retention.ts`.
import { db } from "@/db";
import { listRecordsPastRetention, lockPatient, removePatientRecord } from "@/db/queries/admin-patients";
import { hashIdentifier } from "@/lib/admin/tokens";
import { audit } from "@/lib/records/audit";
import { passportPdfPrefix } from "@/lib/passport";
import { getSettings } from "@/lib/config/settings";
import { deleteObjectsUnder } from "@/lib/storage";
import { uploadPrefix } from "@/lib/records/uploads";

export type RetentionResult = { retentionDays: number | null; removed: number; objectKeys: string[]; objectsDeleted: number; failed: number };

export async function removeExpiredRecords({ now = new Date(), log = (m: string) => console.log(`[retention] ${m}`) }: { now?: Date; log?: (m: string) => void } = {}): Promise<RetentionResult> {
  const { retentionDays } = await getSettings();
  if (retentionDays === null) {
    log("no retention period is configured; nothing removed");
    return { retentionDays, removed: 0, objectKeys: [], objectsDeleted: 0, failed: 0 };
  }
  const closedBefore = new Date(now.getTime() - retentionDays * 86_400_000);
  const due = await listRecordsPastRetention({ closedBefore });
  let removed = 0;
  let objectsDeleted = 0;
  let failed = 0;
  const objectKeys: string[] = [];
  for (const { id } of due) {
    // One record per transaction; a failure (object store away) rolls that record back whole and
    // the next night's run tries it again, while the other records go on.
    await db.transaction(async (tx) => {
      const row = await lockPatient({ patientId: id }, tx);
      // Re-checked under the lock: reopened or already removed meanwhile.
      if (!row?.closedAt || row.closedAt >= closedBefore) return;
      const result = await removePatientRecord({ patientId: id, userId: row.userId }, tx);
      // The files go inside the transaction, under the lock: if the store fails, the rows come
      // back and the next run tries again. Everything under the patient's prefixes goes, not only
      // the keys the rows name (the booklet of a revoked passport, an upload never completed).
      const deleted = await deleteObjectsUnder({ prefixes: [uploadPrefix(id), passportPdfPrefix(id)], keys: result.objectKeys });
      await audit(
        {
          action: "retention.remove",
          via: "system",
          details: {
            hrnHash: hashIdentifier("hrn", row.hrn),
            closedAt: row.closedAt.toISOString(),
            retentionDays,
            uploads: result.objectKeys.length,
            storedFiles: deleted,
            rows: result.rows,
          },
        },
        tx,
      );
      const counts = Object.entries({ ...result.rows, "stored files": deleted })
        .filter(([, n]) => n > 0)
        .map(([t, n]) => `${t} ${n}`)
        .join(", ");
      log(`removed the record ${hashIdentifier("hrn", row.hrn).slice(0, 12)}… closed ${row.closedAt.toISOString().slice(0, 10)}: ${counts}`);
      objectKeys.push(...result.objectKeys);
      objectsDeleted += deleted;
      removed++;
    }).catch((error: unknown) => {
      failed++;
      log(`could not remove a record due for removal (kept whole, tried again on the next run): ${error instanceof Error ? error.message : String(error)}`);
    });
  }
  log(`removed ${removed} closed record(s) past ${retentionDays} days${failed ? `; ${failed} failed` : ""}`);
  return { retentionDays, removed, objectKeys, objectsDeleted, failed };
}
