import "server-only";
// A fixed-window limiter in PostgreSQL, so the limit holds across app instances: one atomic
// upsert per request (a new window resets the count).
import { sql } from "drizzle-orm";
import { db } from "@/db";

export async function hitRateLimit({ key, limit, windowSeconds }: { key: string; limit: number; windowSeconds: number }) {
  const result = await db.execute<{ count: number }>(sql`
    insert into request_limits (key, window_start, count) values (${key}, now(), 1)
    on conflict (key) do update set
      count = case when request_limits.window_start < now() - make_interval(secs => ${windowSeconds}) then 1 else request_limits.count + 1 end,
      window_start = case when request_limits.window_start < now() - make_interval(secs => ${windowSeconds}) then now() else request_limits.window_start end
    returning count`);
  const count = Number(result.rows[0]?.count ?? 0);
  return { allowed: count <= limit, count };
}
