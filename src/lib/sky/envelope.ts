/**
 * Pointing envelopes: the limits an instrument can point within (API contract "Envelopes").
 *
 * All fields optional, degrees unless said: minAltitude, maxAltitude (apparent = refracted altitude,
 * as an instrument reads it), azimuthRanges [[from, to], ...] (clockwise from → to, may wrap through
 * north; [a, a] or [0, 360] is the full circle; an empty list means no azimuth limit), keyholeRadius
 * (no pointing closer than this to the zenith), sunAvoidance / moonAvoidance (minimum separation from
 * the Sun's / Moon's centre), horizonMask [[azimuth, altitude], ...] (linear in azimuth, wrapping at
 * 360°), hourAngleLimits [min, max] in hours, declinationLimits [min, max] (apparent, of date).
 *
 * A margin is the signed distance to a limit in its own unit: ≥ 0 inside, < 0 violated.
 */
import { DEG, RAD, wrap360 } from './math';

/**
 * A validated envelope (the zod schema that checks API input is src/lib/contracts/envelope.ts; the
 * engine stays free of validation libraries). Missing fields mean "no limit".
 */
export interface Envelope {
  name?: string | undefined;
  minAltitude?: number | undefined;
  maxAltitude?: number | undefined;
  azimuthRanges?: [number, number][] | undefined;
  keyholeRadius?: number | undefined;
  sunAvoidance?: number | undefined;
  moonAvoidance?: number | undefined;
  horizonMask?: [number, number][] | undefined;
  hourAngleLimits?: [number, number] | undefined;
  declinationLimits?: [number, number] | undefined;
}

export type LimitName =
  | 'minAltitude' | 'maxAltitude' | 'azimuthRanges' | 'keyholeRadius' | 'sunAvoidance' | 'moonAvoidance'
  | 'horizonMask' | 'hourAngleLimits' | 'declinationLimits';

export interface LimitCheck {
  limit: LimitName;
  /** Signed distance to the limit: ≥ 0 inside, < 0 violated. Degrees, or hours for hourAngleLimits. */
  margin: number;
  unit: 'deg' | 'h';
}

export interface Pointing {
  azDeg: number;
  /** Apparent (refracted) altitude. */
  altDeg: number;
  haHours?: number;
  /** Apparent declination of date. */
  decDeg?: number;
}

export interface AzAlt {
  azDeg: number;
  altDeg: number;
}

export interface EnvelopeContext {
  sun?: AzAlt | null;
  moon?: AzAlt | null;
}

export interface EnvelopeEvaluation {
  allowed: boolean;
  violations: LimitCheck[];
  checks: LimitCheck[];
}

/** Clockwise span of a range [from, to] in degrees, 360 for a full circle. */
export function rangeSpanDeg(from: number, to: number): number {
  const s = wrap360(to - from);
  return s === 0 ? 360 : s;
}

/** Margin of an azimuth against clockwise ranges: inside → distance to the nearer edge; outside → −distance to the nearest edge. */
export function azimuthMarginDeg(azDeg: number, ranges: ReadonlyArray<readonly [number, number]>): number {
  if (ranges.length === 0) return Infinity;
  let best = -Infinity;
  for (const [from, to] of ranges) {
    const span = rangeSpanDeg(from, to);
    if (span >= 360) return Infinity;
    const off = wrap360(azDeg - from);
    let m: number;
    if (off <= span) m = Math.min(off, span - off);
    else m = -Math.min(off - span, 360 - off);
    if (m > best) best = m;
  }
  return best;
}

/** A horizon mask prepared for fast lookup: azimuths sorted in [0, 360). */
export interface PreparedMask {
  az: Float64Array;
  alt: Float64Array;
}

const maskCache = new WeakMap<object, PreparedMask>();

export function prepareMask(mask: ReadonlyArray<readonly [number, number]>): PreparedMask {
  const cached = maskCache.get(mask);
  if (cached) return cached;
  const pts = mask.map(([a, h], i) => ({ a: wrap360(a), h, i })).sort((p, q) => p.a - q.a || p.i - q.i);
  const out = { az: Float64Array.from(pts, (p) => p.a), alt: Float64Array.from(pts, (p) => p.h) };
  maskCache.set(mask, out);
  return out;
}

/** Mask altitude at an azimuth: linear interpolation in azimuth, wrapping at 360°. */
export function maskAltitudeDeg(m: PreparedMask, azDeg: number): number {
  const n = m.az.length;
  if (n === 0) return -90;
  if (n === 1) return m.alt[0];
  const a = wrap360(azDeg);
  // first index with az > a
  let lo = 0, hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (m.az[mid] <= a) lo = mid + 1;
    else hi = mid;
  }
  const j = lo % n;
  const i = (lo - 1 + n) % n;
  const a0 = m.az[i];
  let a1 = m.az[j];
  let x = a;
  if (a1 <= a0) a1 += 360;
  if (x < a0) x += 360;
  const span = a1 - a0;
  if (span <= 0) return m.alt[j];
  return m.alt[i] + ((m.alt[j] - m.alt[i]) * (x - a0)) / span;
}

/** Angular distance between two az/alt directions, degrees. */
export function azAltSeparationDeg(a: AzAlt, b: AzAlt): number {
  const ca = Math.cos(a.altDeg * DEG), cb = Math.cos(b.altDeg * DEG);
  const x1 = Math.sin(a.azDeg * DEG) * ca, y1 = Math.cos(a.azDeg * DEG) * ca, z1 = Math.sin(a.altDeg * DEG);
  const x2 = Math.sin(b.azDeg * DEG) * cb, y2 = Math.cos(b.azDeg * DEG) * cb, z2 = Math.sin(b.altDeg * DEG);
  const cx = y1 * z2 - z1 * y2, cy = z1 * x2 - x1 * z2, cz = x1 * y2 - y1 * x2;
  return Math.atan2(Math.hypot(cx, cy, cz), x1 * x2 + y1 * y2 + z1 * z2) * RAD;
}

/**
 * Evaluates one pointing against an envelope. Sun/Moon avoidance needs their positions in ctx
 * (a limit whose input is missing — e.g. no hour angle given — is skipped).
 */
export function evaluateEnvelope(env: Envelope, p: Pointing, ctx: EnvelopeContext = {}): EnvelopeEvaluation {
  const checks: LimitCheck[] = [];
  const push = (limit: LimitName, margin: number, unit: 'deg' | 'h' = 'deg') => {
    if (Number.isFinite(margin)) checks.push({ limit, margin, unit });
  };
  if (env.minAltitude !== undefined) push('minAltitude', p.altDeg - env.minAltitude);
  if (env.maxAltitude !== undefined) push('maxAltitude', env.maxAltitude - p.altDeg);
  if (env.azimuthRanges && env.azimuthRanges.length) push('azimuthRanges', azimuthMarginDeg(p.azDeg, env.azimuthRanges));
  if (env.keyholeRadius !== undefined) push('keyholeRadius', 90 - p.altDeg - env.keyholeRadius);
  if (env.sunAvoidance !== undefined && ctx.sun) push('sunAvoidance', azAltSeparationDeg(p, ctx.sun) - env.sunAvoidance);
  if (env.moonAvoidance !== undefined && ctx.moon) push('moonAvoidance', azAltSeparationDeg(p, ctx.moon) - env.moonAvoidance);
  if (env.horizonMask && env.horizonMask.length) push('horizonMask', p.altDeg - maskAltitudeDeg(prepareMask(env.horizonMask), p.azDeg));
  if (env.hourAngleLimits && p.haHours !== undefined) {
    const [lo, hi] = env.hourAngleLimits;
    push('hourAngleLimits', Math.min(p.haHours - lo, hi - p.haHours), 'h');
  }
  if (env.declinationLimits && p.decDeg !== undefined) {
    const [lo, hi] = env.declinationLimits;
    push('declinationLimits', Math.min(p.decDeg - lo, hi - p.decDeg));
  }
  const violations = checks.filter((c) => c.margin < 0);
  return { allowed: violations.length === 0, violations, checks };
}
