/**
 * The night of a site: what the altitude-over-time chart, the sky-coverage chart, the per-target figures
 * and the fixed night API (`GET /api/scenes/:id/night`) show. Pure: site, envelope, targets, span and
 * step in; plain JSON out (times ISO UTC).
 *
 * - `samples` lie on the step grid from + k·step (k = 0 … while ≤ to); one sky frame per grid instant
 *   serves every target. Altitudes are apparent (standard refraction, 1013.25 hPa / 10 °C, as
 *   `/api/sky/observe`), airmass Kasten & Young (1989), null below the horizon.
 * - `windows` are `visibilityWindows` (windows.ts) over the same span with the grid step the windows API
 *   chooses (`windowsStepSec`), so their edges equal `POST /api/sky/windows` for the same envelope.
 *   A scene without an envelope uses the horizon (apparent altitude ≥ 0), as the windows CSV does.
 * - `best` is the highest point inside a window (`inWindow: true`), or the highest point of the span when
 *   the target has no window (`inWindow: false`); its time is refined to ≤ 1 s by golden-section search;
 *   Moon and Sun separations are between apparent topocentric directions (unrefracted) at that time.
 * - The default span (`sceneNight`) is the night around the scene time: if the Sun is down then, from its
 *   last setting to its next rising; if it is up, the coming night. Where the Sun does not set or rise
 *   within a day (polar day or night), the 24 h centred on the scene time.
 */
import { Astronomy } from './astronomy';
import { RAD, wrap360 } from './math';
import { skyFrame, type SkyFrame } from './apparent';
import { bodyVector, type BodyName } from './bodies';
import { unitVectors, unitVectorsToEnu } from './stars';
import { apparentAltitudeDeg } from './refraction';
import { airmassKastenYoung } from './airmass';
import { riseTransitSet, skyEvents } from './events';
import { visibilityWindows, type WindowTarget } from './windows';
import type { Envelope } from './envelope';
import type { SiteInput } from './frames';

/** Longest span the night API accepts. */
export const MAX_NIGHT_SPAN_MS = 36 * 3600000;
export const HORIZON_ENVELOPE: Envelope = { name: 'horizon', minAltitude: 0 };

export interface NightSite {
  name?: string;
  lat: number;
  lon: number;
  height?: number;
  timeZone?: string;
}

export type NightTarget = WindowTarget;

export interface NightInput {
  site: NightSite;
  /** null: the horizon is the only limit. */
  envelope: Envelope | null;
  targets: NightTarget[];
  /** ms since 1970, UTC. */
  from: number;
  to: number;
  stepMin: number;
  /** Extra bodies to sample for the chart (Moon and planets), besides the targets. */
  bodies?: BodyName[];
}

export interface NightSample {
  time: string;
  altitude: number;
  azimuth: number;
  airmass: number | null;
}

export interface NightWindow {
  start: string;
  end: string;
  openedBy: string;
  closedBy: string;
}

export interface NightBest {
  time: string;
  altitude: number;
  azimuth: number;
  airmass: number | null;
  moonSeparation: number;
  sunSeparation: number;
  /** true: the highest point inside a window; false: no window, the highest point of the span. */
  inWindow: boolean;
}

export interface NightTargetOut {
  name: string;
  body?: BodyName;
  samples: NightSample[];
  windows: NightWindow[];
  /** Limits that keep the target out when it has no window (most frequent first). */
  reasons: string[];
  best: NightBest;
}

export interface NightAnswer {
  site: { name?: string; lat: number; lon: number; height: number; timeZone?: string };
  from: string;
  to: string;
  step: number;
  envelope: Envelope | null;
  sun: { events: { kind: string; time: string }[]; samples: { time: string; altitude: number; azimuth: number }[] };
  moon: {
    /** Illuminated fraction (0–1) at the middle of the span. */
    illumination: number;
    /** Sun–Moon ecliptic longitude difference at the middle of the span: 0 new, 90 first quarter, 180 full, 270 last quarter. */
    phase: number;
    samples: { time: string; altitude: number; azimuth: number }[];
  };
  bodies: { body: BodyName; samples: { time: string; altitude: number; azimuth: number }[] }[];
  targets: NightTargetOut[];
  windowStepSec: number;
}

export const siteInputOf = (s: NightSite): SiteInput => ({ latDeg: s.lat, lonDeg: s.lon > 180 ? s.lon - 360 : s.lon, heightM: s.height ?? 0 });

/** Grid instants without milliseconds (`…:00Z`); refined instants keep them, as the windows API writes them. */
const iso = (t: number) => new Date(Math.round(t)).toISOString().replace('.000Z', 'Z');

/**
 * Grid step of the windows search, as the windows API chooses it (api.ts `windowsStepSec`): 120 s up to
 * 2 days, coarser for many targets so one request stays near 5 million limit evaluations.
 */
export function windowsGridStepSec(spanMs: number, nTargets: number): number {
  const base = spanMs <= 2 * 86400000 ? 120 : 300;
  const needed = ((spanMs / 1000) * Math.max(1, nTargets)) / 5e6;
  return Math.min(1800, Math.max(base, Math.ceil(needed / 60) * 60));
}

/**
 * The night around an instant (see the header): [sunset, sunrise] in ms, rounded out to whole minutes.
 * The Sun's rises and sets are searched from a day before `at`; most nights are settled by the first two
 * days of that search, so those are scanned first (the same sample grid, so the same event times) and the
 * third day only when the night is not settled by then (polar day or night, or a long one).
 */
export function sceneNight(site: NightSite, at: Date): { from: number; to: number; polar: boolean } {
  const s = siteInputOf(site);
  const t = at.getTime();
  const day = 86400000;
  const from = new Date(t - day);
  return nightAround(riseTransitSet(s, { body: 'sun' }, from, new Date(t + day)), t, true) ?? nightAround(riseTransitSet(s, { body: 'sun' }, from, new Date(t + 2 * day)), t, false)!;
}

/** The night from the Sun's rises and sets around t; null (when `partial`) if the list does not settle it. */
function nightAround(ev: readonly { kind: string; time: Date }[], t: number, partial: boolean): { from: number; to: number; polar: boolean } | null {
  const day = 86400000;
  const sets = ev.filter((e) => e.kind === 'set').map((e) => e.time.getTime());
  const rises = ev.filter((e) => e.kind === 'rise').map((e) => e.time.getTime());
  const lastSet = sets.filter((x) => x <= t).pop();
  const lastRise = rises.filter((x) => x <= t).pop();
  const sunDown = lastSet !== undefined && (lastRise === undefined || lastSet > lastRise);
  const start = sunDown ? lastSet! : sets.find((x) => x > t);
  const end = start !== undefined ? rises.find((x) => x > start) : undefined;
  if (partial && (start === undefined || end === undefined)) return null;
  if (start === undefined || end === undefined || end - start > day || (!sunDown && start - t > day)) {
    return { from: Math.floor((t - day / 2) / 60000) * 60000, to: Math.floor((t - day / 2) / 60000) * 60000 + day, polar: true };
  }
  return { from: Math.floor(start / 60000) * 60000, to: Math.ceil(end / 60000) * 60000, polar: false };
}

/** Apparent (refracted) altitude and azimuth of an unrefracted ENU direction for a frame. */
function altAz(f: SkyFrame, E: number, N: number, U: number): { alt: number; az: number } {
  const h = Math.hypot(E, N);
  const trueAlt = Math.atan2(U, h) * RAD;
  return { alt: apparentAltitudeDeg(trueAlt, 'standard', f.refraction), az: h === 0 ? 0 : wrap360(Math.atan2(E, N) * RAD) };
}

const sepDeg = (a: ArrayLike<number>, b: ArrayLike<number>) => {
  const c = a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
  const x = a[1] * b[2] - a[2] * b[1], y = a[2] * b[0] - a[0] * b[2], z = a[0] * b[1] - a[1] * b[0];
  return Math.atan2(Math.hypot(x, y, z), c) * RAD;
};

const round = (x: number, d: number) => {
  const k = 10 ** d;
  return Math.round(x * k) / k;
};

/** Unrefracted ENU of one target at a frame. */
function targetEnu(f: SkyFrame, t: NightTarget, u: Float64Array | null, out: Float64Array): Float64Array {
  if ('body' in t) {
    const e = bodyVector(f, t.body).enu;
    out[0] = e[0]; out[1] = e[1]; out[2] = e[2];
  } else unitVectorsToEnu(f, u!, out, 1);
  return out;
}

export function nightData(input: NightInput): NightAnswer {
  const { from, to } = input;
  const site = siteInputOf(input.site);
  const stepMs = input.stepMin * 60000;
  const times: number[] = [];
  for (let t = from; t <= to + 1e-6; t += stepMs) times.push(t);
  const targets = input.targets;
  const n = targets.length;
  const fixed = targets.map((t, i) => ('body' in t ? -1 : i)).filter((i) => i >= 0);
  const fixedU = unitVectors({
    raDeg: Float64Array.from(fixed, (i) => (targets[i] as { raDeg: number }).raDeg),
    decDeg: Float64Array.from(fixed, (i) => (targets[i] as { decDeg: number }).decDeg),
  });
  const fixedPos = new Int32Array(n).fill(-1);
  fixed.forEach((i, j) => (fixedPos[i] = j));
  const enuBuf = new Float64Array(3 * fixed.length);
  const extraBodies = [...new Set(input.bodies ?? [])];

  const samples: NightSample[][] = targets.map(() => []);
  const sunSamples: NightAnswer['sun']['samples'] = [];
  const moonSamples: NightAnswer['moon']['samples'] = [];
  const bodySamples = extraBodies.map((body) => ({ body, samples: [] as { time: string; altitude: number; azimuth: number }[] }));
  for (const t of times) {
    const f = skyFrame(site, new Date(t));
    const time = iso(t);
    if (fixed.length) unitVectorsToEnu(f, fixedU, enuBuf, fixed.length);
    const bodyEnu = new Map<BodyName, [number, number, number]>();
    const bodyAt = (b: BodyName) => {
      let e = bodyEnu.get(b);
      if (!e) bodyEnu.set(b, (e = bodyVector(f, b).enu));
      return e;
    };
    const sun = altAz(f, ...bodyAt('sun'));
    sunSamples.push({ time, altitude: round(sun.alt, 4), azimuth: round(sun.az, 4) });
    const moon = altAz(f, ...bodyAt('moon'));
    moonSamples.push({ time, altitude: round(moon.alt, 4), azimuth: round(moon.az, 4) });
    for (const bs of bodySamples) {
      const p = altAz(f, ...bodyAt(bs.body));
      bs.samples.push({ time, altitude: round(p.alt, 4), azimuth: round(p.az, 4) });
    }
    for (let i = 0; i < n; i++) {
      const tg = targets[i];
      let p: { alt: number; az: number };
      if ('body' in tg) p = altAz(f, ...bodyAt(tg.body));
      else {
        const k = fixedPos[i] * 3;
        p = altAz(f, enuBuf[k], enuBuf[k + 1], enuBuf[k + 2]);
      }
      samples[i].push({ time, altitude: round(p.alt, 4), azimuth: round(p.az, 4), airmass: nullableRound(airmassKastenYoung(p.alt), 4) });
    }
  }

  const envelope = input.envelope ?? HORIZON_ENVELOPE;
  const windowStepSec = windowsGridStepSec(to - from, n);
  const win = n ? visibilityWindows(site, envelope, targets, new Date(from), new Date(to), { stepSec: windowStepSec }) : [];

  const one = new Float64Array(3);
  const out: NightTargetOut[] = targets.map((tg, i) => {
    const u = fixedPos[i] >= 0 ? fixedU.subarray(fixedPos[i] * 3, fixedPos[i] * 3 + 3) : null;
    const altAt = (t: number) => {
      const f = skyFrame(site, new Date(t));
      const e = targetEnu(f, tg, u, one);
      return altAz(f, e[0], e[1], e[2]).alt;
    };
    const windows = win[i]?.windows ?? [];
    const intervals = windows.length ? windows.map((w) => [w.start.getTime(), w.end.getTime()] as const) : [[from, to] as const];
    let bestT = intervals[0][0], bestAlt = -Infinity;
    for (const [a, b] of intervals) {
      const cands = [a, b, ...times.filter((t) => t > a && t < b)];
      let localT = a, localAlt = -Infinity;
      for (const t of cands) {
        const alt = t === a || t === b ? altAt(t) : samples[i][Math.round((t - from) / stepMs)].altitude;
        if (alt > localAlt) { localAlt = alt; localT = t; }
      }
      // parabola through the best grid sample and its neighbours (altitude is smooth near its maximum)
      let tt = localT, aa = localAlt;
      const k = Math.round((localT - from) / stepMs);
      if (times[k] === localT && k > 0 && k < times.length - 1 && times[k - 1] > a && times[k + 1] < b) {
        const y0 = samples[i][k - 1].altitude, y1 = samples[i][k].altitude, y2 = samples[i][k + 1].altitude;
        const den = y0 - 2 * y1 + y2;
        if (den < 0) {
          const v = localT + (0.5 * (y0 - y2) / den) * stepMs;
          const alt = altAt(v);
          if (alt > aa) { tt = v; aa = alt; }
        }
      }
      if (aa > bestAlt) { bestAlt = aa; bestT = tt; }
    }
    const f = skyFrame(site, new Date(bestT));
    const e = Float64Array.from(targetEnu(f, tg, u, one));
    const p = altAz(f, e[0], e[1], e[2]);
    return {
      name: tg.name,
      ...('body' in tg ? { body: tg.body } : {}),
      samples: samples[i],
      windows: windows.map((w) => ({ start: w.start.toISOString(), end: w.end.toISOString(), openedBy: w.openedBy, closedBy: w.closedBy })),
      reasons: win[i]?.reasons ?? [],
      best: {
        time: iso(bestT),
        altitude: round(p.alt, 4),
        azimuth: round(p.az, 4),
        airmass: nullableRound(airmassKastenYoung(p.alt), 4),
        moonSeparation: round(sepDeg(e, bodyVector(f, 'moon').enu), 3),
        sunSeparation: round(sepDeg(e, bodyVector(f, 'sun').enu), 3),
        inWindow: windows.length > 0,
      },
    };
  });

  const mid = new Date((from + to) / 2);
  const ill = Astronomy.Illumination(Astronomy.Body.Moon, mid);
  const s = input.site;
  return {
    site: { ...(s.name !== undefined ? { name: s.name } : {}), lat: s.lat, lon: s.lon, height: s.height ?? 0, ...(s.timeZone ? { timeZone: s.timeZone } : {}) },
    from: iso(from),
    to: iso(to),
    step: input.stepMin,
    envelope: input.envelope,
    sun: { events: skyEvents(site, { body: 'sun' }, new Date(from), new Date(to)).events.map((e) => ({ kind: e.kind, time: e.time.toISOString() })), samples: sunSamples },
    moon: { illumination: round(ill.phase_fraction, 4), phase: round(Astronomy.MoonPhase(mid), 2), samples: moonSamples },
    bodies: bodySamples,
    targets: out,
    windowStepSec,
  };
}

const nullableRound = (x: number | null, d: number) => (x === null ? null : round(x, d));

/** Maximum of a unimodal function on [a, b] by golden-section search to `tol` (same unit as a, b). */
export function goldenMax(g: (t: number) => number, a: number, b: number, tol: number): number {
  const r = (Math.sqrt(5) - 1) / 2;
  let c = b - r * (b - a), d = a + r * (b - a);
  let gc = g(c), gd = g(d);
  while (b - a > tol) {
    if (gc > gd) { b = d; d = c; gd = gc; c = b - r * (b - a); gc = g(c); }
    else { a = c; c = d; gc = gd; d = a + r * (b - a); gd = g(d); }
  }
  return (a + b) / 2;
}
