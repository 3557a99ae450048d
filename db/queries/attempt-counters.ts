import "server-only";
// Fixed-window attempt counters (table attempt_counters; lib/http/rate-limit.ts has the rules).
import { sql, type Placeholder } from "drizzle-orm";

/**
 * Counts one attempt against `key`, starting a new window when the last one is over; returns
 * `count` and `window_started_at`. A fragment, so a statement can count and work in one trip
 * (placeholders for a statement prepared once: db/queries/passport-card.ts).
 */
export function countAttemptQuery({ key, windowSeconds }: { key: string | Placeholder; windowSeconds: number | Placeholder }) {
  return sql`
    insert into attempt_counters (key, count, window_started_at) values (${key}, 1, now())
    on conflict (key) do update set
      count = case when attempt_counters.window_started_at <= now() - make_interval(secs => ${windowSeconds})
                   then 1 else attempt_counters.count + 1 end,
      window_started_at = case when attempt_counters.window_started_at <= now() - make_interval(secs => ${windowSeconds})
                   then now() else attempt_counters.window_started_at end
    returning count, window_started_at`;
}
