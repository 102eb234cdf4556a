import { sql } from 'drizzle-orm';
import { db } from './db';
import { HttpError } from './http';
import { rateLimits } from './db/schema';

/**
 * Fixed-window counter kept in the database so that several app instances share one limit.
 * Returns the count after this hit; throws 429 with Retry-After when over `limit`. `cost` > 1 charges a
 * hit by its weight (the compute routes charge their estimated work).
 */
export async function rateLimit(key: string, limit: number, windowSec: number, now = Date.now(), cost = 1): Promise<number> {
  const windowStart = Math.floor(now / 1000 / windowSec) * windowSec;
  const rows = await db
    .insert(rateLimits)
    .values({ key, windowStart, count: cost })
    .onConflictDoUpdate({ target: [rateLimits.key, rateLimits.windowStart], set: { count: sql`${rateLimits.count} + ${cost}` } })
    .returning({ count: rateLimits.count });
  const count = rows[0]?.count ?? 1;
  if (count > limit) {
    const retryAfter = Math.max(1, windowStart + windowSec - Math.floor(now / 1000));
    throw new HttpError(429, 'rate_limited', 'Too many requests; try again later.', undefined, undefined, {
      'retry-after': String(retryAfter),
    });
  }
  return count;
}

/** Reads a counter without counting a hit (sign-in throttling counts only failures). */
export async function rateCount(key: string, windowSec: number, now = Date.now()): Promise<number> {
  const windowStart = Math.floor(now / 1000 / windowSec) * windowSec;
  const r = await db.run(sql`select count from rate_limits where key = ${key} and window_start = ${windowStart}`);
  return Number((r.rows[0] as unknown as { count?: number } | undefined)?.count ?? 0);
}

/** Old windows are dropped now and then so the table stays small. */
export async function pruneRateLimits(now = Date.now()): Promise<void> {
  await db.delete(rateLimits).where(sql`${rateLimits.windowStart} < ${Math.floor(now / 1000) - 86_400}`);
}
