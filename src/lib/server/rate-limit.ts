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
  const rows = await db.write((tx) =>
    tx
      .insert(rateLimits)
      .values({ key, windowStart, count: cost })
      .onConflictDoUpdate({ target: [rateLimits.key, rateLimits.windowStart], set: { count: sql`${rateLimits.count} + ${cost}` } })
      .returning({ count: rateLimits.count }),
  );
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
  // `all`, not `get`: drizzle's libsql `get` of a raw statement fails on an empty result
  const rows = await db.all<{ count: number }>(sql`select count from rate_limits where key = ${key} and window_start = ${windowStart}`);
  return Number(rows[0]?.count ?? 0);
}

/** Old windows are dropped now and then so the table stays small. */
export async function pruneRateLimits(now = Date.now()): Promise<void> {
  await db.write((tx) => tx.delete(rateLimits).where(sql`${rateLimits.windowStart} < ${Math.floor(now / 1000) - 86_400}`));
}

/** A counted attempt that can be given back (see `reserve`). */
export interface Reservation {
  /** Takes the hit back (a success that should not count, or an attempt refused by another limit). */
  release(): Promise<void>;
}

/**
 * Reserves one attempt under several limits at once, before the expensive check it guards: each counter
 * is increased atomically in the database first (so concurrent requests, in any instance, cannot all
 * read "4 of 5" and all proceed) and the attempt is refused when any is over its limit — the hits are
 * then given back, so refused attempts do not count. 429 with the longest Retry-After of the limits hit.
 */
export interface ReservedLimit {
  key: string;
  limit: number;
  windowSec: number;
  /** What the refusal says when this limit is the one hit (the wait is appended); a generic line otherwise. */
  message?: string;
}

/** "45 seconds", "12 minutes", "3 hours": how long a 429 asks the client to wait, in words. */
export function waitInWords(sec: number): string {
  const unit = (n: number, w: string) => `${n} ${w}${n === 1 ? '' : 's'}`;
  if (sec < 90) return unit(Math.max(1, Math.round(sec)), 'second');
  if (sec < 90 * 60) return unit(Math.round(sec / 60), 'minute');
  return unit(Math.round(sec / 3600), 'hour');
}

export async function reserve(limits: ReservedLimit[], now = Date.now()): Promise<Reservation> {
  const rows = limits.map((l) => ({ key: l.key, windowStart: Math.floor(now / 1000 / l.windowSec) * l.windowSec, count: 1 }));
  // One statement for every counter: one write (and one fsync) an attempt, whatever the number of limits.
  const counts = await db.write((tx) =>
    tx
      .insert(rateLimits)
      .values(rows)
      .onConflictDoUpdate({ target: [rateLimits.key, rateLimits.windowStart], set: { count: sql`${rateLimits.count} + 1` } })
      .returning({ key: rateLimits.key, count: rateLimits.count }),
  );
  const countOf = new Map(counts.map((c) => [c.key, c.count]));
  let released = false;
  const release = async () => {
    if (released) return;
    released = true;
    const match = sql.join(rows.map((r) => sql`(key = ${r.key} and window_start = ${r.windowStart})`), sql` or `);
    await db.write((tx) => tx.run(sql`update rate_limits set count = count - 1 where count > 0 and (${match})`));
  };
  let retryAfter = 0;
  let hit: ReservedLimit | undefined;
  limits.forEach((l, i) => {
    const wait = rows[i]!.windowStart + l.windowSec - Math.floor(now / 1000);
    if ((countOf.get(l.key) ?? 1) > l.limit && wait > retryAfter) {
      retryAfter = wait;
      hit = l;
    }
  });
  if (retryAfter > 0) {
    await release();
    const wait = Math.max(1, retryAfter);
    const message = hit?.message ? `${hit.message} Try again in ${waitInWords(wait)}.` : 'Too many attempts; try again later.';
    throw new HttpError(429, 'rate_limited', message, undefined, undefined, { 'retry-after': String(wait) });
  }
  return { release };
}
