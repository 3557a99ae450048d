/**
 * A large invented data set for the benchmark, made inside PostgreSQL with generate_series so it
 * takes seconds: 10,000 patients in the Harbourside team's care, 50,000 catheter episodes (four
 * removed, one in place per patient) with 50,000 events, and 200,000 diary entries.
 * Patients first; then the episodes (and their events) and the diary entries, which depend only
 * on the patients, load at once on two connections, one per core. Each step's time is returned.
 */
import pg from "pg";

type Counts = { patients: number; episodes: number; events: number; diary: number };

async function connect(databaseUrl: string) {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  // Bulk transactions: no need to wait for each commit's log flush.
  await client.query("set synchronous_commit = off");
  return client;
}

/** Runs `steps` in one transaction on its own connection, timing each step. */
async function inTransaction(databaseUrl: string, steps: [string, (c: pg.Client) => Promise<unknown>][], times: Record<string, number>) {
  const client = await connect(databaseUrl);
  try {
    await client.query("begin");
    for (const [name, step] of steps) {
      const t0 = Date.now();
      await step(client);
      times[name] = (Date.now() - t0) / 1000;
    }
    await client.query("commit");
  } catch (e) {
    await client.query("rollback").catch(() => {});
    throw e;
  } finally {
    await client.end();
  }
}

export async function seedLarge(databaseUrl: string, { patients = 10_000, episodesPerPatient = 5, diaryPerPatient = 20 } = {}) {
  const times: Record<string, number> = {};
  let teamId = "";
  await inTransaction(
    databaseUrl,
    [
      [
        "patients",
        async (client) => {
          const team = await client.query<{ id: string }>("select id from organisations where kind = 'community_team' order by name limit 1");
          const gp = await client.query<{ id: string }>("select id from organisations where kind = 'gp_practice' order by name limit 1");
          if (!team.rowCount || !gp.rowCount) throw new Error("seed the demo first");
          teamId = team.rows[0].id;
          await client.query(
            `insert into patients (given_name, family_name, health_record_number, date_of_birth, sex, preferred_locale, weight_kg, gp_practice_id,
                                   latest_check_in_level, latest_check_in_at)
             select 'Bench' || g, 'Patient' || lpad(g::text, 5, '0'), 'BENCH-' || lpad(g::text, 6, '0'),
                    date '1940-01-01' + (g % 15000), case when g % 2 = 0 then 'female' else 'male' end,
                    (array['en','es','pl','ro','ar','ur'])[1 + g % 6], 50 + g % 50, $1,
                    case when g % 37 = 0 then 'urgent' when g % 11 = 0 then 'soon' else null end,
                    case when g % 11 = 0 then now() - (g % 48) * interval '1 hour' else null end
             from generate_series(1, $2) g
             on conflict (health_record_number) do nothing`,
            [gp.rows[0].id, patients],
          );
          await client.query(
            `insert into care_team (patient_id, organisation_id)
             select id, $1 from patients where health_record_number like 'BENCH-%' on conflict do nothing`,
            [teamId],
          );
        },
      ],
    ],
    times,
  );
  await Promise.all([
    inTransaction(
      databaseUrl,
      [
        [
          // Episodes k = 1..n per patient, 28 days apart; the last one is still in place.
          "episodes",
          (client) =>
            client.query(
              `insert into catheter_episodes (patient_id, organisation_id, route, catheter_type, material, length_category, size_ch, balloon_ml,
                                              indication, inserted_at, inserted_by_name, planned_change_on, review_due_on, max_dwell_days,
                                              removed_at, removal_reason, awaiting_twoc)
               select p.id, $1, case when p.n % 9 = 0 then 'suprapubic' else 'urethral' end, 'two-way', 'all-silicone', 'standard',
                      (array[12,14,16])[1 + p.n % 3], 10, 'Benchmark data', t.inserted, 'Bench Nurse',
                      (t.inserted + interval '84 days')::date, (t.inserted + interval '28 days')::date, 84,
                      case when k < $2 then t.inserted + interval '28 days' else null end,
                      case when k < $2 then 'blockage' else null end,
                      k = $2 and p.n % 23 = 0
               from (select id, row_number() over (order by health_record_number) as n from patients where health_record_number like 'BENCH-%') p
               cross join generate_series(1, $2) k
               cross join lateral (select now() - ((($2 - k) * 28) + (p.n % 90)) * interval '1 day' as inserted) t
               where not exists (select 1 from catheter_episodes e where e.patient_id = p.id)`,
              [teamId, episodesPerPatient],
            ),
        ],
        [
          "events",
          (client) =>
            client.query(
              `insert into episode_events (episode_id, patient_id, kind, reason, occurred_at, recorded_by_name, organisation_id)
               select e.id, e.patient_id, case when e.previous_episode_id is null then 'insertion' else 'unplanned_change' end,
                      case when e.previous_episode_id is null then null else 'blockage' end, e.inserted_at, 'Bench Nurse', $1
               from catheter_episodes e join patients p on p.id = e.patient_id
               where p.health_record_number like 'BENCH-%'
                 and not exists (select 1 from episode_events v where v.episode_id = e.id)`,
              [teamId],
            ),
        ],
      ],
      times,
    ),
    inTransaction(
      databaseUrl,
      [
        [
          "diary",
          (client) =>
            client.query(
              `insert into diary_entries (patient_id, kind, volume_ml, at)
               select p.id, case when k % 2 = 0 then 'in' else 'out' end, 150 + (k * 37) % 400, now() - k * interval '3 hours'
               from patients p cross join generate_series(1, $1) k
               where p.health_record_number like 'BENCH-%'
                 and not exists (select 1 from diary_entries d where d.patient_id = p.id)`,
              [diaryPerPatient],
            ),
        ],
      ],
      times,
    ),
  ]);
  const client = await connect(databaseUrl);
  try {
    const t0 = Date.now();
    // Vacuumed as well as analysed, then checkpointed: a bulk load sets off autovacuum on every
    // table it filled and leaves the checkpointer about a gigabyte to write, and either would
    // otherwise run through the measures that follow (a commit waiting on it doubled a p99).
    await client.query("vacuum (analyze) patients, care_team, catheter_episodes, episode_events, diary_entries");
    await client.query("checkpoint");
    times["vacuum, analyze and checkpoint"] = (Date.now() - t0) / 1000;
    const counts = await client.query<Counts>(
      `select (select count(*) from patients)::int as patients, (select count(*) from catheter_episodes)::int as episodes,
              (select count(*) from episode_events)::int as events, (select count(*) from diary_entries)::int as diary`,
    );
    return { ...counts.rows[0], times };
  } finally {
    await client.end();
  }
}
