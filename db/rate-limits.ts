import "server-only";
import { db } from "./knex";

export interface RateLimitResult {
  allowed: boolean;
  count: number;
  retryAfterS: number;
}

/**
 * Counts one hit against `key` in a fixed window, in PostgreSQL so every app server shares the count.
 * Returns whether the hit is within `limit`.
 */
export async function hitRateLimit(key: string, windowS: number, limit: number): Promise<RateLimitResult> {
  const { rows } = await db.raw<{ rows: { count: number; window_start: Date }[] }>(
    `insert into rate_limits (key, window_start, count)
     values (?, to_timestamp(floor(extract(epoch from now()) / ?) * ?), 1)
     on conflict (key, window_start) do update set count = rate_limits.count + 1
     returning count, window_start`,
    [key, windowS, windowS],
  );
  const row = rows[0]!;
  const windowEnd = new Date(row.window_start).getTime() + windowS * 1000;
  return {
    allowed: row.count <= limit,
    count: row.count,
    retryAfterS: Math.max(1, Math.ceil((windowEnd - Date.now()) / 1000)),
  };
}

/** Takes back one hit of the current window (an attempt that turned out not to count, e.g. a sign-in that succeeded). */
export async function forgiveRateLimit(key: string, windowS: number): Promise<void> {
  await db.raw(
    `update rate_limits set count = greatest(count - 1, 0)
      where key = ? and window_start = to_timestamp(floor(extract(epoch from now()) / ?) * ?)`,
    [key, windowS, windowS],
  );
}

/** Removes windows that ended more than a day ago. */
export async function pruneRateLimits(): Promise<number> {
  return db("rate_limits").where("window_start", "<", db.raw("now() - interval '1 day'")).delete();
}
