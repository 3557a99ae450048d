// Runs the retention job once: removes closed records whose retention period has ended.
//   npx tsx scripts/retention.ts   (also scheduled daily by pg-boss: lib/jobs/boss.ts)
import "./server-only-shim.cjs";
import { pool } from "@/db";
import { removeExpiredRecords } from "@/lib/jobs/retention";

removeExpiredRecords()
  .then(async (r) => {
    console.log(JSON.stringify({ removed: r.removed, retentionDays: r.retentionDays }));
    await pool.end();
  })
  .catch(async (e) => {
    console.error("[retention] failed:", e);
    await pool.end();
    process.exit(1);
  });
