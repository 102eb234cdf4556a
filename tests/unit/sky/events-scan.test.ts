/**
 * The coarse event scan (events.ts `scan`: hourly steps, 10-minute samples only where a crossing or a
 * transit can lie) gives exactly the events of the scan that samples every 10-minute step — same kinds,
 * same times to the millisecond, same always-up / always-down flags — over random sites (polar ones
 * included), targets (Sun, Moon, planets, stars near the pole and the equator) and spans. The events
 * themselves are checked against JPL DE405 + ERFA in bodies-de405.test.ts and against USNO-convention
 * values in events.test.ts; this file checks that skipping changes nothing.
 */
import { describe, expect, it } from 'vitest';
import { riseTransitSetDetailed, skyEvents, twilightEvents } from '../../../src/lib/sky/events';
import type { Target } from '../../../src/lib/sky/observe';
import { rng } from './helpers';

const r = rng(20261203);
const pick = <T,>(xs: T[]) => xs[Math.floor(r() * xs.length)];
const TARGETS: Target[] = [
  { body: 'sun' }, { body: 'moon' }, { body: 'venus' }, { body: 'jupiter' },
  { raDeg: 37.95, decDeg: 89.26 }, // near the pole: circumpolar almost everywhere north
  { raDeg: 101.29, decDeg: -16.72 },
  { raDeg: 279.23, decDeg: 38.78 },
  { raDeg: 95.99, decDeg: -52.7 },
];
const cases = Array.from({ length: 60 }, (_, i) => {
  const lat = i < 10 ? (r() < 0.5 ? -1 : 1) * (64 + r() * 14) : -60 + r() * 120; // the first ten near or past the polar circles
  return {
    site: { latDeg: lat, lonDeg: -180 + r() * 360, heightM: Math.round(r() * 3000) },
    target: pick(TARGETS),
    from: new Date(Date.UTC(2000 + Math.floor(r() * 40), Math.floor(r() * 12), 1 + Math.floor(r() * 28), Math.floor(r() * 24), Math.floor(r() * 60), Math.floor(r() * 60))),
    hours: 6 + r() * 90,
  };
});
const plain = (xs: { kind: string; time: Date }[]) => xs.map((e) => `${e.kind} ${e.time.toISOString()}`);

describe('coarse event scan = scan of every 10-minute step', () => {
  it('rise, transit and set: same events and flags for 60 random sites, targets and spans', () => {
    let events = 0;
    for (const c of cases) {
      const to = new Date(c.from.getTime() + c.hours * 3600000);
      const a = riseTransitSetDetailed(c.site, c.target, c.from, to);
      const b = riseTransitSetDetailed(c.site, c.target, c.from, to, { everyStep: true });
      expect(plain(a.events), JSON.stringify(c)).toEqual(plain(b.events));
      expect([a.alwaysUp, a.alwaysDown]).toEqual([b.alwaysUp, b.alwaysDown]);
      events += a.events.length;
    }
    // the comparison is not empty: most cases have several events
    expect(events).toBeGreaterThan(200);
  });

  it('twilights and the Sun with twilights (the events API): same events', () => {
    for (const c of cases.slice(0, 30)) {
      const to = new Date(c.from.getTime() + c.hours * 3600000);
      expect(plain(twilightEvents(c.site, c.from, to))).toEqual(plain(twilightEvents(c.site, c.from, to, { everyStep: true })));
      const a = skyEvents(c.site, { body: 'sun' }, c.from, to), b = skyEvents(c.site, { body: 'sun' }, c.from, to, { everyStep: true });
      expect(plain(a.events)).toEqual(plain(b.events));
      expect([a.alwaysUp, a.alwaysDown]).toEqual([b.alwaysUp, b.alwaysDown]);
    }
  });

  it('a span shorter than one coarse step and a span of exactly one step give the same events too', () => {
    const site = { latDeg: 51.48, lonDeg: 0, heightM: 45 };
    for (const [from, minutes] of [['2026-06-21T03:20:00Z', 25], ['2026-06-21T20:00:00Z', 60], ['2026-12-21T15:30:00Z', 61]] as const) {
      const f = new Date(from), t = new Date(f.getTime() + minutes * 60000);
      expect(plain(skyEvents(site, { body: 'sun' }, f, t).events)).toEqual(plain(skyEvents(site, { body: 'sun' }, f, t, { everyStep: true }).events));
    }
  });
});
