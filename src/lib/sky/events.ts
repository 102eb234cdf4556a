/**
 * Rise, transit, set, twilight and Moon phases over a span (USNO conventions, geometric
 * topocentric altitude of the centre against a fixed h0):
 *   Sun: h0 = −0°50′ (34′ standard refraction + 16′ semidiameter);
 *   stars, planets and custom targets: h0 = −0°34′;
 *   Moon: h0 = −0°34′ − its topocentric semidiameter at that instant (the parallax is inside the
 *   topocentric altitude itself);
 *   twilight: the Sun's centre at −6° (civil), −12° (nautical), −18° (astronomical);
 *   transit: upper culmination, hour angle 0.
 * The model is this engine's own apparent place (apparent.ts / bodies.ts); the span is sampled every
 * 10 minutes where a crossing is possible (hourly elsewhere, see `scan`) and each sign change is refined by
 * bisection to < 0.05 s. Two crossings closer together than the step (a grazing target) can be missed.
 */
import { Astronomy } from './astronomy';
import { RAD } from './math';
import { H0_STAR_DEG, H0_SUN_DEG, MOON_RADIUS_KM } from './constants';
import { apparentFromIcrs, skyFrame, type SkyFrame } from './apparent';
import { bodyVector, type BodyName } from './bodies';
import type { SiteInput } from './frames';
import type { Target } from './observe';

export type EventKind =
  | 'rise' | 'transit' | 'set'
  | 'civil-dawn' | 'civil-dusk' | 'nautical-dawn' | 'nautical-dusk' | 'astronomical-dawn' | 'astronomical-dusk';

export interface SkyEvent {
  kind: EventKind;
  time: Date;
}

const STEP_MS = 10 * 60 * 1000;
const TOL_MS = 50;

interface Sample {
  t: number;
  /** Geometric altitude of the centre, degrees. */
  alt: number;
  /** Hour angle, degrees (−180, 180]. */
  ha: number;
  /** Rise/set threshold h0 at this instant, degrees. */
  h0: number;
}

function sampler(site: SiteInput, target: Target): (t: number) => Sample {
  return (t: number) => {
    const f: SkyFrame = skyFrame(site, new Date(t));
    let enu: ArrayLike<number>;
    let h0 = H0_STAR_DEG;
    if ('body' in target) {
      const bv = bodyVector(f, target.body);
      enu = bv.enu;
      if (target.body === 'sun') h0 = H0_SUN_DEG;
      else if (target.body === 'moon') h0 = H0_STAR_DEG - Math.asin(MOON_RADIUS_KM / bv.distanceKm) * RAD;
    } else {
      enu = apparentFromIcrs(f, target.raDeg, target.decDeg, target.motion).enu;
    }
    const E = enu[0], N = enu[1], U = enu[2];
    return {
      t,
      alt: Math.atan2(U, Math.hypot(E, N)) * RAD,
      ha: Math.atan2(-E, -f.sinLat * N + f.cosLat * U) * RAD,
      h0,
    };
  };
}

/** Root of g between a and b (g(a), g(b) of opposite signs) to TOL_MS, by bisection. */
function refine(g: (t: number) => number, a: number, ga: number, b: number, _gb: number): number {
  while (b - a > TOL_MS) {
    const c = (a + b) / 2;
    const gc = g(c);
    if (gc === 0) return c;
    if ((gc > 0) === (ga > 0)) { a = c; ga = gc; } else b = c;
  }
  return (a + b) / 2;
}

interface Threshold {
  /** g(sample) > 0 means "above". */
  g: (s: Sample) => number;
  up: EventKind;
  down: EventKind;
}

/**
 * The scan takes coarse steps of COARSE × 10 minutes and looks inside one only where something can happen
 * there. Any direction's geometric altitude changes at most at its angular speed in the horizon frame: the
 * Earth's rotation (15.04°/h) plus the Moon's own motion and the turning of its parallax (< 0.95°/h), so
 * ALT_RATE = 17°/h bounds every target. Between two samples with the same sign of a threshold's margin g,
 * g can change sign (and back) only if |g₀| + |g₁| ≤ ALT_RATE · Δt; the hour angle grows monotonically by
 * about 15° an hour, so a transit lies inside only if it goes from below 0 to 0 or more. Where neither can
 * happen the inner 10-minute samples have the signs of the ends and are skipped; elsewhere they are taken,
 * so every crossing is bracketed by the same 10-minute samples and refined by the same bisection as a scan
 * of every step (`everyStep`), with the same result (tests/unit/sky/events-scan.test.ts).
 */
const COARSE = 6;
const ALT_RATE_DEG_PER_MS = 17 / 3600000;

function scan(sample: (t: number) => Sample, from: number, to: number, thresholds: Threshold[], withTransit: boolean, everyStep = false) {
  const events: { kind: EventKind; t: number }[] = [];
  const aboveAll: boolean[] = thresholds.map(() => true);
  const belowAll: boolean[] = thresholds.map(() => true);
  let prev = sample(from);
  const cache = new Map<number, Sample>();
  const s = (t: number) => {
    let v = cache.get(t);
    if (!v) { v = sample(t); cache.set(t, v); }
    return v;
  };
  thresholds.forEach((th, k) => { if (th.g(prev) > 0) belowAll[k] = false; else aboveAll[k] = false; });
  /** One 10-minute step from prev to cur: sign changes refined, transits found, flags kept. */
  const step = (cur: Sample) => {
    thresholds.forEach((th, k) => {
      const g0 = th.g(prev), g1 = th.g(cur);
      if (g1 > 0) belowAll[k] = false; else aboveAll[k] = false;
      if ((g0 > 0) !== (g1 > 0)) {
        const root = refine((x) => th.g(s(x)), prev.t, g0, cur.t, g1);
        events.push({ kind: g1 > 0 ? th.up : th.down, t: root });
      }
    });
    if (withTransit && prev.ha < 0 && cur.ha >= 0 && cur.ha - prev.ha < 90) {
      const root = refine((x) => s(x).ha, prev.t, prev.ha, cur.t, cur.ha);
      events.push({ kind: 'transit', t: root });
    }
    prev = cur;
  };
  /** Nothing can happen between a and b (see above). */
  const quiet = (a: Sample, b: Sample) => {
    const reach = ALT_RATE_DEG_PER_MS * (b.t - a.t);
    for (const th of thresholds) {
      const g0 = th.g(a), g1 = th.g(b);
      if ((g0 > 0) !== (g1 > 0) || Math.abs(g0) + Math.abs(g1) <= reach) return false;
    }
    if (!withTransit) return true;
    const d = b.ha - a.ha;
    return ((a.ha < 0) === (b.ha < 0) && d >= 0 && d < 30) || (a.ha > 150 && b.ha < -150);
  };
  for (let t0 = from; t0 < to; ) {
    const tc = everyStep ? Math.min(t0 + STEP_MS, to) : Math.min(t0 + COARSE * STEP_MS, to);
    const end = sample(tc);
    if (everyStep || quiet(prev, end)) step(end);
    else
      for (let t = t0 + STEP_MS; ; t += STEP_MS) {
        const tt = Math.min(t, tc);
        step(tt === tc ? end : sample(tt));
        if (tt >= tc) break;
      }
    t0 = tc;
  }
  return { events, aboveAll, belowAll };
}

const toEvents = (list: { kind: EventKind; t: number }[], from: number, to: number): SkyEvent[] =>
  list
    .filter((e) => e.t >= from && e.t <= to)
    .sort((a, b) => a.t - b.t)
    .map((e) => ({ kind: e.kind, time: new Date(Math.round(e.t)) }));

export interface RiseTransitSetResult {
  events: SkyEvent[];
  /** Above its h0 for the whole span (circumpolar, or polar day for the Sun). */
  alwaysUp: boolean;
  /** Below its h0 for the whole span (never rises). */
  alwaysDown: boolean;
}

/** `everyStep`: sample every 10-minute step (the reference the coarse scan is tested against). */
export interface ScanOptions {
  everyStep?: boolean;
}

export function riseTransitSetDetailed(site: SiteInput, target: Target, fromDate: Date, toDate: Date, opts: ScanOptions = {}): RiseTransitSetResult {
  const from = fromDate.getTime(), to = toDate.getTime();
  const th: Threshold = { g: (s) => s.alt - s.h0, up: 'rise', down: 'set' };
  const r = scan(sampler(site, target), from, to, [th], true, opts.everyStep);
  return { events: toEvents(r.events, from, to), alwaysUp: r.aboveAll[0], alwaysDown: r.belowAll[0] };
}

/** Rise, transit and set events of a target between two instants, in time order. */
export function riseTransitSet(site: SiteInput, target: Target, fromDate: Date, toDate: Date): SkyEvent[] {
  return riseTransitSetDetailed(site, target, fromDate, toDate).events;
}

const TWILIGHTS: Threshold[] = [
  { g: (s) => s.alt + 6, up: 'civil-dawn', down: 'civil-dusk' },
  { g: (s) => s.alt + 12, up: 'nautical-dawn', down: 'nautical-dusk' },
  { g: (s) => s.alt + 18, up: 'astronomical-dawn', down: 'astronomical-dusk' },
];

/** Civil, nautical and astronomical dawn and dusk between two instants. */
export function twilightEvents(site: SiteInput, fromDate: Date, toDate: Date, opts: ScanOptions = {}): SkyEvent[] {
  const from = fromDate.getTime(), to = toDate.getTime();
  return toEvents(scan(sampler(site, { body: 'sun' }), from, to, TWILIGHTS, false, opts.everyStep).events, from, to);
}

/** Everything the events API reports: rise/transit/set, plus the twilights for the Sun. */
export function skyEvents(site: SiteInput, target: Target, fromDate: Date, toDate: Date, opts: ScanOptions = {}): RiseTransitSetResult {
  const from = fromDate.getTime(), to = toDate.getTime();
  const isSun = 'body' in target && target.body === 'sun';
  const th: Threshold[] = [{ g: (s) => s.alt - s.h0, up: 'rise', down: 'set' }, ...(isSun ? TWILIGHTS : [])];
  const r = scan(sampler(site, target), from, to, th, true, opts.everyStep);
  return { events: toEvents(r.events, from, to), alwaysUp: r.aboveAll[0], alwaysDown: r.belowAll[0] };
}

/**
 * The next event of a kind after `from`, searching up to `maxDays` ahead; null when none. Twilight kinds
 * always refer to the Sun (the target is then ignored).
 */
export function nextEvent(site: SiteInput, target: Target, kind: EventKind, from: Date, maxDays = 400): SkyEvent | null {
  const chunk = 2 * 86400000;
  const end = from.getTime() + maxDays * 86400000;
  const twilight = kind !== 'rise' && kind !== 'set' && kind !== 'transit';
  for (let t = from.getTime(); t < end; t += chunk) {
    const t1 = Math.min(t + chunk, end);
    const list = twilight ? twilightEvents(site, new Date(t), new Date(t1)) : riseTransitSet(site, target, new Date(t), new Date(t1));
    const hit = list.find((e) => e.kind === kind && e.time.getTime() > from.getTime());
    if (hit) return hit;
  }
  return null;
}

export type MoonPhaseKind = 'new-moon' | 'first-quarter' | 'full-moon' | 'last-quarter';
const QUARTERS: MoonPhaseKind[] = ['new-moon', 'first-quarter', 'full-moon', 'last-quarter'];

/** Moon phases (geocentric ecliptic longitude difference 0°, 90°, 180°, 270°) between two instants. */
export function moonPhases(fromDate: Date, toDate: Date): { kind: MoonPhaseKind; time: Date }[] {
  const out: { kind: MoonPhaseKind; time: Date }[] = [];
  let q = Astronomy.SearchMoonQuarter(fromDate);
  while (q.time.date.getTime() <= toDate.getTime()) {
    out.push({ kind: QUARTERS[q.quarter], time: q.time.date });
    q = Astronomy.NextMoonQuarter(q);
  }
  return out;
}

export type { BodyName };
