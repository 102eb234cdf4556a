/**
 * Data preparation for the night charts (altitude over time, sky coverage, the figures table), from the
 * night API's answer (src/lib/sky/night.ts). Pure: no DOM, React or d3; the drawing lives in
 * src/components/night/. Times are ms since 1970 (UTC), angles degrees.
 */
import { airmassKastenYoung } from '../sky/airmass';
import type { DaylightKey } from '../style/palette';

export interface TimedAlt {
  time: string;
  altitude: number;
}
export interface Interval {
  start: string;
  end: string;
}
export interface Pt {
  t: number;
  alt: number;
}
export interface Run {
  inside: boolean;
  points: Pt[];
}

const ms = (s: string) => Date.parse(s);

/** Linear altitude at instant t from samples sorted by time (clamped at the ends). */
export function altitudeAt(samples: readonly TimedAlt[], t: number): number {
  const n = samples.length;
  if (!n) return NaN;
  if (t <= ms(samples[0].time)) return samples[0].altitude;
  if (t >= ms(samples[n - 1].time)) return samples[n - 1].altitude;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (ms(samples[mid].time) <= t) lo = mid;
    else hi = mid;
  }
  const t0 = ms(samples[lo].time), t1 = ms(samples[hi].time);
  const w = t1 > t0 ? (t - t0) / (t1 - t0) : 0;
  return samples[lo].altitude + (samples[hi].altitude - samples[lo].altitude) * w;
}

/**
 * A target's curve split into runs inside and outside its windows. Window edges become points of both
 * neighbouring runs (altitude interpolated between the samples), so the runs join without a gap.
 */
export function curveRuns(samples: readonly TimedAlt[], windows: readonly Interval[]): Run[] {
  if (samples.length === 0) return [];
  const wins = windows.map((w) => [ms(w.start), ms(w.end)] as const);
  const t0 = ms(samples[0].time), t1 = ms(samples[samples.length - 1].time);
  const pts: Pt[] = samples.map((s) => ({ t: ms(s.time), alt: s.altitude }));
  for (const [a, b] of wins) for (const e of [a, b]) if (e > t0 && e < t1 && !pts.some((p) => p.t === e)) pts.push({ t: e, alt: altitudeAt(samples, e) });
  pts.sort((p, q) => p.t - q.t);
  const insideAt = (t: number) => wins.some(([a, b]) => t >= a && t <= b);
  if (pts.length === 1) return [{ inside: insideAt(pts[0].t), points: pts }];
  const runs: Run[] = [];
  for (let i = 0; i + 1 < pts.length; i++) {
    const inside = insideAt((pts[i].t + pts[i + 1].t) / 2);
    const last = runs[runs.length - 1];
    if (last && last.inside === inside) last.points.push(pts[i + 1]);
    else runs.push({ inside, points: [pts[i], pts[i + 1]] });
  }
  return runs;
}

export interface Band {
  key: DaylightKey;
  start: number;
  end: number;
}

/** The daylight state each Sun event leads into, and the state before it. */
const AFTER: Record<string, DaylightKey> = {
  set: 'civil', 'civil-dusk': 'nautical', 'nautical-dusk': 'astronomical', 'astronomical-dusk': 'night',
  'astronomical-dawn': 'astronomical', 'nautical-dawn': 'nautical', 'civil-dawn': 'civil', rise: 'day',
};
const BEFORE: Record<string, DaylightKey> = {
  set: 'day', 'civil-dusk': 'civil', 'nautical-dusk': 'nautical', 'astronomical-dusk': 'astronomical',
  'astronomical-dawn': 'night', 'nautical-dawn': 'astronomical', 'civil-dawn': 'nautical', rise: 'civil',
};

/**
 * Day / civil / nautical / astronomical twilight / night bands over [from, to] from the Sun's events
 * (rise/set at −50′, twilights at −6°, −12°, −18°). `fallback` is the state when the span has no event
 * (polar day or night, or a short span inside one state).
 */
export function daylightBands(events: readonly { kind: string; time: string }[], from: number, to: number, fallback: DaylightKey): Band[] {
  const ev = events.filter((e) => e.kind in AFTER).map((e) => ({ key: AFTER[e.kind], before: BEFORE[e.kind], t: ms(e.time) })).filter((e) => e.t > from && e.t < to).sort((a, b) => a.t - b.t);
  let state: DaylightKey = ev.length ? ev[0].before : fallback;
  let start = from;
  const out: Band[] = [];
  for (const e of ev) {
    if (e.t > start) out.push({ key: state, start, end: e.t });
    state = e.key;
    start = e.t;
  }
  out.push({ key: state, start, end: to });
  return out;
}

export interface LimitBand {
  limit: 'minAltitude' | 'maxAltitude' | 'keyholeRadius';
  label: string;
  /** Altitudes (degrees) of the band's lower and upper edge. */
  low: number;
  high: number;
}

/** Altitude bands the envelope forbids at every azimuth: below the floor, above the ceiling, the keyhole round the zenith. */
export function limitBands(env: { minAltitude?: number; maxAltitude?: number; keyholeRadius?: number } | null | undefined, floor = 0): LimitBand[] {
  if (!env) return [];
  const out: LimitBand[] = [];
  if (env.minAltitude !== undefined && env.minAltitude > floor) out.push({ limit: 'minAltitude', label: `Below the ${fmt(env.minAltitude)}° floor`, low: floor, high: env.minAltitude });
  if (env.maxAltitude !== undefined && env.maxAltitude < 90) out.push({ limit: 'maxAltitude', label: `Above the ${fmt(env.maxAltitude)}° ceiling`, low: env.maxAltitude, high: 90 });
  if (env.keyholeRadius !== undefined && env.keyholeRadius > 0) out.push({ limit: 'keyholeRadius', label: `Keyhole ${fmt(env.keyholeRadius)}° round the zenith`, low: 90 - env.keyholeRadius, high: 90 });
  return out;
}

const fmt = (x: number) => String(Math.round(x * 10) / 10);

/** Apparent altitude at which the Kasten & Young airmass equals x (x ≥ 1), by bisection to 1e-6°. */
export function altitudeForAirmass(x: number): number {
  let lo = 0, hi = 90;
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if ((airmassKastenYoung(mid) ?? Infinity) > x) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/** Airmass ticks for the second axis, with the altitude each sits at. */
export function airmassTicks(values: readonly number[] = [1.0, 1.1, 1.2, 1.5, 2, 3, 5]): { airmass: number; altitude: number }[] {
  return values.map((a) => ({ airmass: a, altitude: a <= 1 ? 90 : altitudeForAirmass(a) }));
}

/** Offset of a time zone from UTC at an instant, minutes (east positive). */
export function zoneOffsetMin(t: number, timeZone: string): number {
  const parts = formatter(timeZone, 'parts').formatToParts(new Date(t));
  const p: Record<string, number> = {};
  for (const x of parts) if (x.type !== 'literal') p[x.type] = Number(x.value);
  const asUtc = Date.UTC(p.year, p.month - 1, p.day, p.hour % 24, p.minute, p.second);
  return Math.round((asUtc - Math.floor(t / 1000) * 1000) / 60000);
}

/** Ticks on whole local hours (every `everyH` hours) of the site's zone across [from, to]. */
export function hourTicks(from: number, to: number, timeZone: string, everyH = 1): number[] {
  const out: number[] = [];
  const H = 3600000;
  const off = zoneOffsetMin(from, timeZone) * 60000;
  const step = everyH * H;
  for (let local = Math.ceil((from + off) / step) * step; local - off <= to; local += step) out.push(local - off);
  return out;
}

/**
 * One Intl.DateTimeFormat per zone and use, made once: making one costs far more than formatting with it,
 * and a chart formats dozens of instants on every redraw.
 */
const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string, use: 'clock' | 'parts'): Intl.DateTimeFormat {
  const key = `${use} ${timeZone}`;
  let f = formatters.get(key);
  if (!f) {
    f =
      use === 'clock'
        ? new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' })
        : new Intl.DateTimeFormat('en-GB', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    formatters.set(key, f);
  }
  return f;
}

/** "21:30" in the site's zone. */
export function clock(t: number, timeZone: string): string {
  return formatter(timeZone, 'clock').format(new Date(t));
}

/** Moon phase in words from the Sun–Moon longitude difference (0 new … 180 full). */
export function moonPhaseName(phaseDeg: number): string {
  const p = ((phaseDeg % 360) + 360) % 360;
  if (p < 22.5 || p >= 337.5) return 'new moon';
  if (p < 67.5) return 'waxing crescent';
  if (p < 112.5) return 'first quarter';
  if (p < 157.5) return 'waxing gibbous';
  if (p < 202.5) return 'full moon';
  if (p < 247.5) return 'waning gibbous';
  if (p < 292.5) return 'last quarter';
  return 'waning crescent';
}

const LIMIT_WORDS: Record<string, string> = {
  minAltitude: 'the altitude floor', maxAltitude: 'the altitude ceiling', keyholeRadius: 'the zenith keyhole', azimuthRanges: 'the azimuth range',
  horizonMask: 'the horizon mask', sunAvoidance: 'the Sun avoidance', moonAvoidance: 'the Moon avoidance', hourAngleLimits: 'the hour-angle limit',
  declinationLimits: 'the declination limit', 'span-end': 'the end of the span', 'span-start': 'the start of the span',
};
export const limitWords = (l: string) => LIMIT_WORDS[l] ?? l;

export interface NightLike {
  from: string;
  to: string;
  sun: { events: { kind: string; time: string }[] };
  moon: { illumination: number; phase?: number };
  targets: { name: string; windows: { start: string; end: string; closedBy: string }[]; reasons?: string[]; best: { time: string; altitude: number; airmass: number | null; inWindow?: boolean } }[];
}

/** The charts' text alternative: the night and each target in sentences, times in the site's zone. */
export function nightSummary(d: NightLike, timeZone: string): string {
  const c = (s: string) => clock(ms(s), timeZone);
  const ev = (k: string) => d.sun.events.find((e) => e.kind === k);
  const parts: string[] = [];
  const set = ev('set'), rise = ev('rise'), dusk = ev('astronomical-dusk'), dawn = ev('astronomical-dawn');
  parts.push(`From ${c(d.from)} to ${c(d.to)} (${timeZone}).`);
  if (set) parts.push(`Sunset ${c(set.time)}.`);
  if (dusk && dawn) parts.push(`Astronomical night ${c(dusk.time)} to ${c(dawn.time)}.`);
  else if (!dusk && !dawn) parts.push('No astronomical night in this span.');
  if (rise) parts.push(`Sunrise ${c(rise.time)}.`);
  parts.push(`Moon ${Math.round(d.moon.illumination * 100)} % lit${d.moon.phase !== undefined ? ` (${moonPhaseName(d.moon.phase)})` : ''}.`);
  for (const t of d.targets) {
    if (!t.windows.length) {
      parts.push(`${t.name}: never inside the limits${t.reasons?.length ? ` (kept out by ${t.reasons.slice(0, 2).map(limitWords).join(' and ')})` : ''}.`);
      continue;
    }
    const w = t.windows.map((x) => `${c(x.start)}–${c(x.end)} (closed by ${limitWords(x.closedBy)})`).join(', ');
    const am = t.best.airmass !== null ? `, airmass ${t.best.airmass.toFixed(2)}` : '';
    parts.push(`${t.name}: inside the limits ${w}; highest ${Math.round(t.best.altitude)}° at ${c(t.best.time)}${am}.`);
  }
  return parts.join(' ');
}

export type SortKey = 'name' | 'window' | 'best' | 'altitude' | 'airmass' | 'moon' | 'sun';

export interface FigureRow {
  name: string;
  index: number;
  firstStart: number | null;
  windowMin: number;
  bestTime: number;
  altitude: number;
  airmass: number | null;
  moonSeparation: number;
  sunSeparation: number;
  inWindow: boolean;
  windows: { start: number; end: number; closedBy: string }[];
}

/** The per-target figures table's rows (one a target, in the answer's order). */
export function figureRows(d: { targets: { name: string; windows: { start: string; end: string; closedBy: string }[]; best: { time: string; altitude: number; airmass: number | null; moonSeparation: number; sunSeparation: number; inWindow?: boolean } }[] }): FigureRow[] {
  return d.targets.map((t, index) => {
    const windows = t.windows.map((w) => ({ start: ms(w.start), end: ms(w.end), closedBy: w.closedBy }));
    return {
      name: t.name,
      index,
      firstStart: windows.length ? windows[0].start : null,
      windowMin: windows.reduce((a, w) => a + (w.end - w.start) / 60000, 0),
      bestTime: ms(t.best.time),
      altitude: t.best.altitude,
      airmass: t.best.airmass,
      moonSeparation: t.best.moonSeparation,
      sunSeparation: t.best.sunSeparation,
      inWindow: t.best.inWindow ?? windows.length > 0,
      windows,
    };
  });
}

/** Sorts rows by a column; targets without a window always sort after those with one (except by name). */
export function sortRows(rows: readonly FigureRow[], key: SortKey, dir: 'asc' | 'desc'): FigureRow[] {
  const sign = dir === 'asc' ? 1 : -1;
  const val = (r: FigureRow): number | string => {
    switch (key) {
      case 'name': return r.name.toLowerCase();
      case 'window': return r.firstStart ?? Infinity;
      case 'best': return r.bestTime;
      case 'altitude': return r.altitude;
      case 'airmass': return r.airmass ?? Infinity;
      case 'moon': return r.moonSeparation;
      case 'sun': return r.sunSeparation;
    }
  };
  return [...rows].sort((a, b) => {
    if (key !== 'name' && a.inWindow !== b.inWindow) return a.inWindow ? -1 : 1;
    const x = val(a), y = val(b);
    const c = x < y ? -1 : x > y ? 1 : 0;
    return c * sign || a.index - b.index;
  });
}

// ---- sky coverage (polar azimuth/altitude) ----

export interface AzAltPt {
  t: number;
  az: number;
  alt: number;
}

/** Polar projection of the sky coverage chart: zenith at the centre, horizon at radius R, north up, east to the right (as seen from below, looking up: east is left). `eastLeft` flips it. */
export function polarXY(az: number, alt: number, cx: number, cy: number, R: number, eastLeft = false): [number, number] {
  const r = (R * (90 - alt)) / 90;
  const a = (az * Math.PI) / 180;
  return [cx + (eastLeft ? -1 : 1) * r * Math.sin(a), cy - r * Math.cos(a)];
}

/** Track runs (above the horizon only) split by whether the segment's middle is inside a window. */
export function trackRuns(samples: readonly { time: string; altitude: number; azimuth: number }[], windows: readonly Interval[]): { inside: boolean; points: AzAltPt[] }[] {
  const wins = windows.map((w) => [ms(w.start), ms(w.end)] as const);
  const inside = (t: number) => wins.some(([a, b]) => t >= a && t <= b);
  const out: { inside: boolean; points: AzAltPt[] }[] = [];
  for (let i = 0; i + 1 < samples.length; i++) {
    const p = samples[i], q = samples[i + 1];
    if (p.altitude < 0 && q.altitude < 0) continue;
    const P = { t: ms(p.time), az: p.azimuth, alt: Math.max(0, p.altitude) }, Q = { t: ms(q.time), az: q.azimuth, alt: Math.max(0, q.altitude) };
    const ins = inside((P.t + Q.t) / 2);
    const last = out[out.length - 1];
    if (last && last.inside === ins && last.points[last.points.length - 1].t === P.t) last.points.push(Q);
    else out.push({ inside: ins, points: [P, Q] });
  }
  return out;
}

/** Points (az, alt) of the small circle of angular radius rDeg round (az0, alt0), every stepDeg of bearing. */
export function smallCircle(az0: number, alt0: number, rDeg: number, stepDeg = 5): { az: number; alt: number }[] {
  const D = Math.PI / 180;
  const la = alt0 * D, lo = az0 * D, d = rDeg * D;
  const out: { az: number; alt: number }[] = [];
  for (let b = 0; b <= 360; b += stepDeg) {
    const br = b * D;
    const lat = Math.asin(Math.sin(la) * Math.cos(d) + Math.cos(la) * Math.sin(d) * Math.cos(br));
    const lon = lo + Math.atan2(Math.sin(br) * Math.sin(d) * Math.cos(la), Math.cos(d) - Math.sin(la) * Math.sin(lat));
    out.push({ az: (((lon / D) % 360) + 360) % 360, alt: lat / D });
  }
  return out;
}

/** Position at instant t from az/alt samples (linear in time; azimuth through the short way round). */
export function azAltAt(samples: readonly { time: string; altitude: number; azimuth: number }[], t: number): { az: number; alt: number } | null {
  const n = samples.length;
  if (!n) return null;
  let i = 0;
  while (i + 1 < n && ms(samples[i + 1].time) <= t) i++;
  const p = samples[i], q = samples[Math.min(n - 1, i + 1)];
  const t0 = ms(p.time), t1 = ms(q.time);
  const w = t1 > t0 ? Math.min(1, Math.max(0, (t - t0) / (t1 - t0))) : 0;
  const dAz = ((q.azimuth - p.azimuth + 540) % 360) - 180;
  return { az: (((p.azimuth + dAz * w) % 360) + 360) % 360, alt: p.altitude + (q.altitude - p.altitude) * w };
}
