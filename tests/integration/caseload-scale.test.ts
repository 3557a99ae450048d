// The caseload with 10,000 patients in one team: one SQL statement per page whatever the page
// size (no query per row; two when a view's second part, the patients without a catheter, is
// reached: tests/integration/caseload-order.test.ts), and fast enough to page, search and filter.
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { COUNT_CAP, listCaseload, listCaseloadAll } from "@/db/queries/caseload";
import { db } from "@/db";
import { countQueries } from "../support/count-queries";
import { organisations } from "@/db/schema";
import { caseloadQuerySchema, type CaseloadQueryInput } from "@/lib/validations/caseload";

const PATIENTS = 10_000;
let orgId: string;

beforeAll(async () => {
  const [org] = await db
    .insert(organisations)
    .values({ name: `Scale Test Team ${Date.now()}`, kind: "community_team" })
    .returning({ id: organisations.id });
  orgId = org.id;
  // Generated in the database: names, record numbers, one catheter each with spread-out dates,
  // every 50th with an urgent check-in and every 40th awaiting a trial without catheter.
  await db.execute(sql`
    with made as (
      insert into patients (given_name, family_name, health_record_number, date_of_birth, sex, latest_check_in_level)
      select 'Given' || g, 'Family' || lpad(g::text, 5, '0'), 'SCALE-' || g, date '1950-01-01' + (g % 9000),
             (array['female','male'])[1 + g % 2],
             case when g % 50 = 0 then 'urgent' else null end
      from generate_series(1, ${PATIENTS}) g
      returning id, health_record_number
    ), team as (
      insert into care_team (patient_id, organisation_id) select id, ${orgId}::uuid from made returning patient_id
    )
    insert into catheter_episodes (patient_id, route, catheter_type, material, length_category, size_ch, balloon_ml,
      indication, inserted_at, inserted_by_name, planned_change_on, review_due_on, awaiting_twoc)
    select m.id, 'urethral', 'two-way', 'all-silicone', 'standard', 14, 10, 'Scale test',
      now() - make_interval(days => n % 90), 'Scale Nurse',
      current_date - (n % 90) + 84, current_date - (n % 90) + 28, n % 40 = 0
    from (select id, substring(health_record_number from 7)::int as n from made) m`);
  await db.execute(sql`analyze patients; analyze care_team; analyze catheter_episodes`);
}, 120_000);

afterAll(async () => {
  if (!orgId) return;
  await db.execute(sql`delete from patients where id in (select patient_id from care_team where organisation_id = ${orgId}::uuid)`);
  await db.execute(sql`delete from organisations where id = ${orgId}::uuid`);
});

function query(input: CaseloadQueryInput) {
  return caseloadQuerySchema.parse(input);
}

describe("caseload at 10,000 patients", () => {
  it("costs one query per page whatever the page size", async () => {
    for (const pageSize of [1, 10, 50, 100]) {
      const { result, queries } = await countQueries(() => listCaseload({ organisationIds: [orgId], dueSoonDays: 7, query: query({ pageSize }) }));
      expect(queries, `pageSize ${pageSize}`).toBe(1);
      expect(result.rows).toHaveLength(pageSize);
      // Counting stops past the cap: "more than 1,000 patients in this view".
      expect(result).toMatchObject({ total: COUNT_CAP, totalIsAtLeast: true });
    }
    const { queries } = await countQueries(() =>
      listCaseload({ organisationIds: [orgId], dueSoonDays: 7, query: query({ pageSize: 100, page: 7, filter: "overdue", q: "family0", sort: "name" }) }),
    );
    expect(queries).toBe(1);
  });

  it("counts the filtered set exactly", async () => {
    const urgent = await listCaseload({ organisationIds: [orgId], dueSoonDays: 7, query: query({ filter: "urgent" }) });
    expect(urgent).toMatchObject({ total: PATIENTS / 50, totalIsAtLeast: false });
    const twoc = await listCaseload({ organisationIds: [orgId], dueSoonDays: 7, query: query({ filter: "twoc" }) });
    expect(twoc.total).toBe(PATIENTS / 40);
    const one = await listCaseload({ organisationIds: [orgId], dueSoonDays: 7, query: query({ q: "SCALE-1234" }) });
    expect(one.rows.map((r) => r.healthRecordNumber)).toContain("SCALE-1234");
    const last = await listCaseload({ organisationIds: [orgId], dueSoonDays: 7, query: query({ page: 100, pageSize: 100, sort: "name" }) });
    expect(last.rows).toHaveLength(100);
    expect(last.rows.at(-1)!.familyName).toBe("Family10000");
    // The last page counts past itself: the total is exact there.
    expect(last).toMatchObject({ total: PATIENTS, totalIsAtLeast: false });
    const all = await listCaseload({ organisationIds: [orgId], dueSoonDays: 7, countCap: 20_000, query: query({}) });
    expect(all).toMatchObject({ total: PATIENTS, totalIsAtLeast: false });
  });

  // Latency is measured by `npm run bench`, not asserted here: a timed test would flake.

  it("exports the whole filtered view in one query per part", async () => {
    const { result, queries } = await countQueries(() =>
      listCaseloadAll({ organisationIds: [orgId], dueSoonDays: 7, view: query({ filter: "urgent" }) }),
    );
    // With a catheter, then without one.
    expect(queries).toBe(2);
    expect(result.rows).toHaveLength(PATIENTS / 50);
  });
});
