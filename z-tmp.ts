import { listCaseload } from "@/db/queries/caseload";
import { db, pool } from "@/db";
import { organisations } from "@/db/schema";
import { caseloadQuerySchema } from "@/lib/validations/caseload";
async function main(){
const orgs = (await db.select().from(organisations)).map(o => o.id);
for (const filter of [undefined, "overdue", "due-soon", "twoc", "urgent"]) {
  const r = await listCaseload({ organisationIds: orgs, query: caseloadQuerySchema.parse({ filter, pageSize: 3, page: 1 }) });
  console.log(filter, r.total, r.rows.map(x => `${x.name} ${x.plannedChangeOn} ${x.reviewDueOn} ${x.state} ${x.daysSinceInsertion}`));
}
const r = await listCaseload({ organisationIds: orgs, query: caseloadQuerySchema.parse({ page: 9 }) });
console.log(r);
const s = await listCaseload({ organisationIds: orgs, query: caseloadQuerySchema.parse({ q: "em-100-00", sort: "name", dir: "desc" }) });
console.log(s.rows.map(r=>r.name));
await pool.end();

}
main();
