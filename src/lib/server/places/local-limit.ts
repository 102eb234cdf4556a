/**
 * A per-process fixed-window limit for the place search and zone lookup. These answers cost a few
 * microseconds of this process's CPU and change nothing, so what needs protecting is this instance, and a
 * database write (with its fsync) per keystroke would cost more than the answer itself: unlike the
 * account and compute limits (rate-limit.ts, shared through the database), each instance counts for
 * itself. Addresses are kept in a bounded LRU map, so a flood of addresses cannot grow it.
 */
import { LRUCache } from 'lru-cache';
import { HttpError } from '../http';

export function localLimiter(limit: number, windowSec: number, maxKeys = 50_000) {
  const windows = new LRUCache<string, { start: number; count: number }>({ max: maxKeys });
  return (key: string, now = Date.now()): void => {
    const start = Math.floor(now / 1000 / windowSec) * windowSec;
    let w = windows.get(key);
    if (!w || w.start !== start) windows.set(key, (w = { start, count: 0 }));
    if (++w.count > limit) {
      throw new HttpError(429, 'rate_limited', 'Too many requests; try again later.', undefined, undefined, {
        'retry-after': String(Math.max(1, start + windowSec - Math.floor(now / 1000))),
      });
    }
  };
}

/** Search as you type sends a request a keystroke; a busy user types ~300 characters a minute. */
export const PLACES_PER_MINUTE = 600;
/** One budget for both place routes, per client address. */
export const placesLimit = localLimiter(PLACES_PER_MINUTE, 60);
