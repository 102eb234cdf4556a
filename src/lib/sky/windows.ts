/**
 * Visibility windows: the intervals when each target is inside an envelope over a span.
 *
 * Method: a time grid (120 s for spans up to 2 days, 300 s beyond); at each grid instant one sky
 * frame, the Sun and Moon (only when an avoidance limit or a body target needs them) and one batched
 * pass for all fixed targets. Where a target's inside/outside state flips between two grid instants
 * the crossing is refined by bisection to ≤ 0.5 s; inside a grid step the Earth rotation is exact and
 * the slow parts (precession-nutation, aberration) are held, while Sun, Moon and body directions are
 * interpolated linearly (errors of a few arcseconds). Windows shorter than the grid step can be missed.
 * Altitudes are apparent (standard refraction), as envelopes are; Sun/Moon separations use their
 * unrefracted directions. `closedBy` names the limit that ends a window ('span-end' at the end of
 * the span), `openedBy` the limit that was violated just before it began ('span-start').
 *
 * Skip-ahead (speed, same answer): a fixed target's direction moves at most at the Earth's rotation rate,
 * so each limit's margin changes at a bounded rate (see RATES below). After evaluating a target at a grid
 * instant, the time during which no limit can change state (inside: the nearest limit; outside: the
 * violated limit that stays violated longest) is computed, and the target is not evaluated at grid
 * instants before it: its inside/outside state there is known. Flips are still found between the same
 * two grid instants and refined by the same bisection, so windows are the ones a full evaluation gives
 * (tests/unit/sky/windows-equal.test.ts compares with the previous, exhaustive search). The per-limit
 * counts behind `reasons` need every grid instant: they are counted afterwards, only for the targets
 * that end with no window. Body targets are evaluated at every grid instant, as before.
 */
import { hasMotion, moveStar, movedRaDec, type SpaceMotion } from './motion';
import { instantFromDate } from './timescales';
import { SUN_SCHWARZSCHILD_AU } from './constants';
import { skyFrame, type SkyFrame } from './apparent';
import { bodyVector, type BodyName } from './bodies';
import { unitVectors } from './stars';
import { STANDARD_CONSTANTS, refractionForTrueAltitudeDeg } from './refraction';
import { azimuthMarginDeg, maskAltitudeDeg, prepareMask, rangeSpanDeg, type Envelope, type LimitName, type PreparedMask } from './envelope';
import type { SiteInput } from './frames';

/**
 * A fixed target (ICRS; with `motion`, moved by its space motion to the middle of the span, which is exact
 * to < 0.1″ for any star over the 31-day limit; its annual parallax, < 1″, is left out of window edges) or a body.
 */
export type WindowTarget = { name: string; raDeg: number; decDeg: number; motion?: SpaceMotion } | { name: string; body: BodyName };

export interface VisibilityWindow {
  start: Date;
  end: Date;
  openedBy: LimitName | 'span-start';
  closedBy: LimitName | 'span-end';
}

export interface TargetWindows {
  name: string;
  windows: VisibilityWindow[];
  /** One entry per window: the limit that closes it; with no window, the limits violated during the span (most frequent first). */
  reasons: string[];
}

export interface WindowOptions {
  stepSec?: number;
}

/** Degrees per radian (as math.ts RAD); a local constant keeps the hot loops free of module-binding reads. */
const RAD = 180 / Math.PI;
const EARTH_ROT_DEG_PER_MS = (1.00273781191135448 * 360) / 86400000;
const REFINE_MS = 500;

interface GridState {
  t: number;
  f: SkyFrame;
  sun: Float64Array | null;
  moon: Float64Array | null;
  bodies: Map<BodyName, Float64Array>;
}

/** Fills `out` (length 3) with the ENU of unit vector u[k..k+2] for frame f and extra rotation dLstDeg. */
function enuOf(f: SkyFrame, ux: number, uy: number, uz: number, dLstDeg: number, out: Float64Array): void {
  // deflection + aberration (as stars.ts), then N·P·B, then the site rotation at LST + dLst
  const ex = f.sunToObs[0], ey = f.sunToObs[1], ez = f.sunToObs[2];
  const vx = f.vObs[0], vy = f.vObs[1], vz = f.vObs[2], bm1 = f.bm1;
  const w0 = SUN_SCHWARZSCHILD_AU / f.sunDistAu;
  const pe = ux * ex + uy * ey + uz * ez;
  const q = 1 + pe;
  const wl = w0 / (q > 1e-6 ? q : 1e-6);
  let x = ux + wl * (ex - ux * pe), y = uy + wl * (ey - uy * pe), z = uz + wl * (ez - uz * pe);
  const pdv = x * vx + y * vy + z * vz;
  const w1 = 1 + pdv / (1 + bm1);
  const X = x * bm1 + w1 * vx + w0 * (vx - pdv * x);
  const Y = y * bm1 + w1 * vy + w0 * (vy - pdv * y);
  const Z = z * bm1 + w1 * vz + w0 * (vz - pdv * z);
  const r = 1 / Math.hypot(X, Y, Z);
  const m = f.npb;
  x = (m[0] * X + m[1] * Y + m[2] * Z) * r;
  y = (m[3] * X + m[4] * Y + m[5] * Z) * r;
  z = (m[6] * X + m[7] * Y + m[8] * Z) * r;
  rotateOfDateToEnu(f, x, y, z, dLstDeg, out);
}

function rotateOfDateToEnu(f: SkyFrame, x: number, y: number, z: number, dLstDeg: number, out: Float64Array): void {
  const lst = (f.lstHours * 15 + dLstDeg) * (Math.PI / 180);
  const sl = Math.sin(lst), cl = Math.cos(lst);
  const sp = f.sinLat, cp = f.cosLat;
  out[0] = -sl * x + cl * y;
  out[1] = -sp * cl * x - sp * sl * y + cp * z;
  out[2] = cp * cl * x + cp * sl * y + sp * z;
}

/** Linear interpolation of two unit ENU vectors (normalised), into out. */
function lerpUnit(a: Float64Array, b: Float64Array, w: number, out: Float64Array): void {
  const x = a[0] + (b[0] - a[0]) * w, y = a[1] + (b[1] - a[1]) * w, z = a[2] + (b[2] - a[2]) * w;
  const n = Math.hypot(x, y, z) || 1;
  out[0] = x / n; out[1] = y / n; out[2] = z / n;
}

const LIMITS: readonly LimitName[] = [
  'minAltitude', 'maxAltitude', 'keyholeRadius', 'azimuthRanges', 'horizonMask', 'sunAvoidance', 'moonAvoidance',
  'hourAngleLimits', 'declinationLimits',
];
const NONE = -1;

/**
 * Evaluator of one envelope: from a target's true ENU (+ Sun/Moon true ENU) to the index in LIMITS of
 * the violated limit closest to its boundary, or NONE when inside. No allocation per call.
 */
function makeEvaluator(env: Envelope) {
  const mask = env.horizonMask && env.horizonMask.length ? prepareMask(env.horizonMask) : null;
  const ranges = env.azimuthRanges && env.azimuthRanges.length ? env.azimuthRanges : null;
  const sunLim = env.sunAvoidance, moonLim = env.moonAvoidance;
  const sunCos = sunLim !== undefined ? Math.cos(sunLim / RAD) : 2;
  const moonCos = moonLim !== undefined ? Math.cos(moonLim / RAD) : 2;
  const minAlt = env.minAltitude, maxAlt = env.maxAltitude, keyhole = env.keyholeRadius;
  const ha = env.hourAngleLimits, decl = env.declinationLimits;
  const k = STANDARD_CONSTANTS;
  return (f: SkyFrame, enu: Float64Array, sun: Float64Array | null, moon: Float64Array | null): number => {
    const E = enu[0], N = enu[1], U = enu[2];
    const trueAlt = Math.atan2(U, Math.sqrt(E * E + N * N)) * RAD;
    const alt = trueAlt + refractionForTrueAltitudeDeg(trueAlt, k);
    let worst = NONE;
    let worstM = -Infinity;
    let m: number;
    if (minAlt !== undefined && (m = alt - minAlt) < 0 && m > worstM) { worst = 0; worstM = m; }
    if (maxAlt !== undefined && (m = maxAlt - alt) < 0 && m > worstM) { worst = 1; worstM = m; }
    if (keyhole !== undefined && (m = 90 - alt - keyhole) < 0 && m > worstM) { worst = 2; worstM = m; }
    if (ranges || mask) {
      let az = Math.atan2(E, N) * RAD;
      if (az < 0) az += 360;
      if (ranges && (m = azimuthMarginDeg(az, ranges)) < 0 && m > worstM) { worst = 3; worstM = m; }
      if (mask && (m = alt - maskAltitudeDeg(mask, az)) < 0 && m > worstM) { worst = 4; worstM = m; }
    }
    if (sun) {
      const c = E * sun[0] + N * sun[1] + U * sun[2];
      if (c > sunCos && (m = Math.acos(Math.min(1, c)) * RAD - sunLim!) < 0 && m > worstM) { worst = 5; worstM = m; }
    }
    if (moon) {
      const c = E * moon[0] + N * moon[1] + U * moon[2];
      if (c > moonCos && (m = Math.acos(Math.min(1, c)) * RAD - moonLim!) < 0 && m > worstM) { worst = 6; worstM = m; }
    }
    if (ha) {
      const h = (Math.atan2(-E, -f.sinLat * N + f.cosLat * U) * RAD) / 15;
      if ((m = Math.min(h - ha[0], ha[1] - h)) < 0 && m > worstM) { worst = 7; worstM = m; }
    }
    if (decl) {
      const d = Math.asin(Math.max(-1, Math.min(1, f.cosLat * N + f.sinLat * U))) * RAD;
      if ((m = Math.min(d - decl[0], decl[1] - d)) < 0 && m > worstM) { worst = 8; worstM = m; }
    }
    return worst;
  };
}

/**
 * Bounds on how fast a fixed target's margins change (degrees, or hours, per second), each with a
 * generous safety factor. A star's apparent direction in the horizon frame turns with the Earth
 * (ω cos δ ≤ ω, ω = 1.0027379 × 360° per solar day) plus the drift of its apparent place (aberration,
 * light deflection, precession-nutation: well under 0.001″/s).
 * - altitude limits use the apparent altitude h + R(h): |1 + dR/dh| ≤ 1.05 for this refraction model
 *   (checked in windows-equal.test.ts);
 * - azimuth ranges: the state changes only when the direction crosses the vertical circle of an edge, so
 *   the time is at least the angular distance to that great circle over ω;
 * - horizon mask: above the mask's highest point or below its lowest, the altitude rate; in between, the
 *   altitude rate plus the mask's steepest slope times the azimuth rate (ω / cos h);
 * - Sun / Moon separation: both turn with the Earth, so only their motion against the stars counts (Sun
 *   ≈ 1°/day; Moon ≤ 17°/day plus ≤ 1° of parallax turning with the site): 1e-4 and 1e-3 °/s;
 * - hour angle grows at the sidereal rate (monotonic; not used within 3° of the pole);
 * - declination of date drifts by far less than 1e-5 °/s (0.036″/s).
 */
const OMEGA_DEG_S = ((1.00273781191135448 * 360) / 86400) * 1.002 + 1e-6;
export const APPARENT_ALT_RATE_FACTOR = 1.05;
const ALT_RATE = OMEGA_DEG_S * APPARENT_ALT_RATE_FACTOR;
const SUN_RATE = 1e-4;
const MOON_RATE = 1e-3;
const HA_RATE_H_S = (1.00273781191135448 / 3600) * 1.01;
const DEC_RATE = 1e-5;
/** Longest skip (s). */
const SKIP_CAP_S = 3 * 3600;
const COS_DEC_MIN_FOR_HA = 0.05;

/**
 * The azimuth of a direction at altitude h changes at most at ω / cos h. Over the next `azRateSpanS(h)`
 * seconds the altitude stays within (|h| + 90°) / 2 of the horizon, so there the azimuth rate is at most
 * `azRateWithin(h)`.
 */
function azRateSpanS(trueAltDeg: number): number {
  return Math.min(SKIP_CAP_S, (90 - Math.abs(trueAltDeg)) / (2 * OMEGA_DEG_S));
}
function azRateWithin(trueAltDeg: number): number {
  const c = Math.cos((Math.abs(trueAltDeg) + 90) / 2 / RAD);
  return c > 1e-9 ? OMEGA_DEG_S / c : Infinity;
}

/** What the star transform and the evaluators read of a sky frame (a SkyFrame has it all). */
type GridFrame = Pick<SkyFrame, 'icrsToEnu' | 'sunToObs' | 'vObs' | 'bm1' | 'sinLat' | 'cosLat'>;

/** Per-grid-instant constants of the star transform (as unitVectorsToEnu computes them). */
interface GridConsts {
  inv1bm1: number;
  w0: number;
  dlim: number;
}
function gridConsts(f: SkyFrame): GridConsts {
  return { inv1bm1: 1 / (1 + f.bm1), w0: SUN_SCHWARZSCHILD_AU / f.sunDistAu, dlim: 1e-6 / Math.max(f.sunDistAu * f.sunDistAu, 1) };
}

/**
 * ENU of one catalogue unit vector u[k..k+2] at a grid instant: the same arithmetic, in the same order,
 * as unitVectorsToEnu (stars.ts), so the result is bit-identical to the batched transform.
 */
function enuAtGrid(f: GridFrame, g: GridConsts, u: Float64Array, k: number, out: Float64Array): void {
  const m = f.icrsToEnu;
  const ex = f.sunToObs[0], ey = f.sunToObs[1], ez = f.sunToObs[2];
  const vx = f.vObs[0], vy = f.vObs[1], vz = f.vObs[2];
  const bm1 = f.bm1, inv1bm1 = g.inv1bm1, w0 = g.w0, dlim = g.dlim;
  let x = u[k], y = u[k + 1], z = u[k + 2];
  const pe = x * ex + y * ey + z * ez;
  const q = 1 + pe;
  const wl = w0 / (q > dlim ? q : dlim);
  x += wl * (ex - x * pe);
  y += wl * (ey - y * pe);
  z += wl * (ez - z * pe);
  const pdv = x * vx + y * vy + z * vz;
  const w1 = 1 + pdv * inv1bm1;
  const X = x * bm1 + w1 * vx + w0 * (vx - pdv * x);
  const Y = y * bm1 + w1 * vy + w0 * (vy - pdv * y);
  const Z = z * bm1 + w1 * vz + w0 * (vz - pdv * z);
  const r = 1 / Math.sqrt(X * X + Y * Y + Z * Z);
  out[0] = (m[0] * X + m[1] * Y + m[2] * Z) * r;
  out[1] = (m[3] * X + m[4] * Y + m[5] * Z) * r;
  out[2] = (m[6] * X + m[7] * Y + m[8] * Z) * r;
}

/** Highest and lowest point and steepest slope (degrees of altitude per degree of azimuth) of a prepared mask. */
function maskShape(m: PreparedMask): { max: number; min: number; slope: number } {
  const n = m.az.length;
  let max = -Infinity, min = Infinity, slope = 0;
  for (let i = 0; i < n; i++) {
    max = Math.max(max, m.alt[i]);
    min = Math.min(min, m.alt[i]);
    if (n < 2) continue;
    const j = (i + 1) % n;
    const span = j === 0 ? m.az[0] + 360 - m.az[i] : m.az[j] - m.az[i];
    const rise = Math.abs(m.alt[j] - m.alt[i]);
    if (rise > 0) slope = Math.max(slope, span > 0 ? rise / span : Infinity);
  }
  return { max, min, slope };
}

/**
 * The grid evaluator: the same worst-limit answer as makeEvaluator (identical arithmetic for the
 * margins), plus in `skip[0]` the seconds during which the target's state (inside or outside) cannot
 * change, for a fixed target (see the rate bounds above).
 */
function makeGridEvaluator(env: Envelope) {
  const mask = env.horizonMask && env.horizonMask.length ? prepareMask(env.horizonMask) : null;
  const shape = mask ? maskShape(mask) : null;
  const ranges = env.azimuthRanges && env.azimuthRanges.length ? env.azimuthRanges : null;
  // edges of the azimuth ranges (none when a range is the full circle: the limit never binds)
  const fullRange = ranges ? ranges.some(([a, b]) => rangeSpanDeg(a, b) >= 360) : true;
  const edgeCos: number[] = [], edgeSin: number[] = [];
  if (ranges && !fullRange)
    for (const [a, b] of ranges)
      for (const e of [a, b]) {
        edgeCos.push(Math.cos(e / RAD));
        edgeSin.push(Math.sin(e / RAD));
      }
  const nEdges = edgeCos.length;
  const sunLim = env.sunAvoidance, moonLim = env.moonAvoidance;
  const sunCos = sunLim !== undefined ? Math.cos(sunLim / RAD) : 2;
  const moonCos = moonLim !== undefined ? Math.cos(moonLim / RAD) : 2;
  const minAlt = env.minAltitude, maxAlt = env.maxAltitude, keyhole = env.keyholeRadius;
  const ha = env.hourAngleLimits, decl = env.declinationLimits;
  const k = STANDARD_CONSTANTS;
  const skip = new Float64Array(1);
  const evaluate = (f: SkyFrame, enu: Float64Array, sun: Float64Array | null, moon: Float64Array | null): number => {
    const E = enu[0], N = enu[1], U = enu[2];
    const trueAlt = Math.atan2(U, Math.sqrt(E * E + N * N)) * RAD;
    const alt = trueAlt + refractionForTrueAltitudeDeg(trueAlt, k);
    let worst = NONE;
    let worstM = -Infinity;
    let m: number;
    // inside: the soonest any limit can flip; outside: the longest a violated limit surely stays violated
    let inMin = Infinity, outMax = 0;
    let tau: number;
    if (minAlt !== undefined) {
      m = alt - minAlt;
      tau = Math.abs(m) / ALT_RATE;
      if (m < 0) {
        if (m > worstM) { worst = 0; worstM = m; }
        if (tau > outMax) outMax = tau;
      } else if (tau < inMin) inMin = tau;
    }
    if (maxAlt !== undefined) {
      m = maxAlt - alt;
      tau = Math.abs(m) / ALT_RATE;
      if (m < 0) {
        if (m > worstM) { worst = 1; worstM = m; }
        if (tau > outMax) outMax = tau;
      } else if (tau < inMin) inMin = tau;
    }
    if (keyhole !== undefined) {
      m = 90 - alt - keyhole;
      tau = Math.abs(m) / ALT_RATE;
      if (m < 0) {
        if (m > worstM) { worst = 2; worstM = m; }
        if (tau > outMax) outMax = tau;
      } else if (tau < inMin) inMin = tau;
    }
    if (ranges || mask) {
      let az = Math.atan2(E, N) * RAD;
      if (az < 0) az += 360;
      if (ranges) {
        m = azimuthMarginDeg(az, ranges);
        tau = Infinity;
        for (let e = 0; e < nEdges; e++) {
          const d = Math.abs(E * edgeCos[e] - N * edgeSin[e]) * RAD / OMEGA_DEG_S;
          if (d < tau) tau = d;
        }
        if (m < 0) {
          if (m > worstM) { worst = 3; worstM = m; }
          if (tau > outMax) outMax = tau;
        } else if (tau < inMin) inMin = tau;
      }
      if (mask) {
        m = alt - maskAltitudeDeg(mask, az);
        const s = shape!;
        tau = alt > s.max ? (alt - s.max) / ALT_RATE : alt < s.min ? (s.min - alt) / ALT_RATE : 0;
        if (s.slope < Infinity) {
          // within `span` the altitude stays below (|h| + 90°) / 2, where the azimuth rate is at most ω / cos of that
          const span = azRateSpanS(trueAlt);
          const t2 = Math.min(span, Math.abs(m) / (ALT_RATE + s.slope * azRateWithin(trueAlt)));
          if (t2 > tau) tau = t2;
        }
        if (m < 0) {
          if (m > worstM) { worst = 4; worstM = m; }
          if (tau > outMax) outMax = tau;
        } else if (tau < inMin) inMin = tau;
      }
    }
    if (sun) {
      const c = E * sun[0] + N * sun[1] + U * sun[2];
      let violated = false;
      if (c > sunCos) {
        m = Math.acos(Math.min(1, c)) * RAD - sunLim!;
        if (m < 0) {
          violated = true;
          if (m > worstM) { worst = 5; worstM = m; }
        }
      }
      tau = Math.abs(Math.acos(Math.max(-1, Math.min(1, c))) * RAD - sunLim!) / SUN_RATE;
      if (violated) { if (tau > outMax) outMax = tau; }
      else if (tau < inMin) inMin = tau;
    }
    if (moon) {
      const c = E * moon[0] + N * moon[1] + U * moon[2];
      let violated = false;
      if (c > moonCos) {
        m = Math.acos(Math.min(1, c)) * RAD - moonLim!;
        if (m < 0) {
          violated = true;
          if (m > worstM) { worst = 6; worstM = m; }
        }
      }
      tau = Math.abs(Math.acos(Math.max(-1, Math.min(1, c))) * RAD - moonLim!) / MOON_RATE;
      if (violated) { if (tau > outMax) outMax = tau; }
      else if (tau < inMin) inMin = tau;
    }
    if (ha) {
      const h = (Math.atan2(-E, -f.sinLat * N + f.cosLat * U) * RAD) / 15;
      m = Math.min(h - ha[0], ha[1] - h);
      const sd = f.cosLat * N + f.sinLat * U;
      const nearPole = 1 - sd * sd < COS_DEC_MIN_FOR_HA * COS_DEC_MIN_FOR_HA;
      if (m < 0) {
        if (m > worstM) { worst = 7; worstM = m; }
        // outside: the hour angle grows until it reaches the lower limit (through ±12 h if past the upper)
        tau = nearPole ? 0 : (h < ha[0] ? ha[0] - h : 24 + ha[0] - h) / HA_RATE_H_S;
        if (tau > outMax) outMax = tau;
      } else {
        tau = nearPole ? 0 : (ha[1] - h) / HA_RATE_H_S;
        if (tau < inMin) inMin = tau;
      }
    }
    if (decl) {
      const d = Math.asin(Math.max(-1, Math.min(1, f.cosLat * N + f.sinLat * U))) * RAD;
      m = Math.min(d - decl[0], decl[1] - d);
      tau = Math.abs(m) / DEC_RATE;
      if (m < 0) {
        if (m > worstM) { worst = 8; worstM = m; }
        if (tau > outMax) outMax = tau;
      } else if (tau < inMin) inMin = tau;
    }
    const t = worst === NONE ? inMin : outMax;
    skip[0] = t < SKIP_CAP_S ? t : SKIP_CAP_S;
    return worst;
  };
  return { evaluate, skip };
}

/**
 * The evaluator for the counts behind `reasons` (targets with no window): the same worst-limit answer as
 * makeEvaluator, plus in `hold[0]` the seconds during which that worst limit cannot change — it stays
 * violated, no other violated limit's margin can overtake it, and no satisfied limit can become violated
 * — from the same rate bounds (margins in hours for the hour angle are compared with degrees as
 * makeEvaluator compares them, so the bound on their difference adds the two rates as numbers).
 */
function makeCountEvaluator(env: Envelope) {
  const mask = env.horizonMask && env.horizonMask.length ? prepareMask(env.horizonMask) : null;
  const slope = mask ? maskShape(mask).slope : 0;
  const ranges = env.azimuthRanges && env.azimuthRanges.length ? env.azimuthRanges : null;
  const sunLim = env.sunAvoidance, moonLim = env.moonAvoidance;
  const sunCos = sunLim !== undefined ? Math.cos(sunLim / RAD) : 2;
  const moonCos = moonLim !== undefined ? Math.cos(moonLim / RAD) : 2;
  const minAlt = env.minAltitude, maxAlt = env.maxAltitude, keyhole = env.keyholeRadius;
  const ha = env.hourAngleLimits, decl = env.declinationLimits;
  const k = STANDARD_CONSTANTS;
  const hold = new Float64Array(1);
  // margin and rate of each limit in LIMITS order (NaN: not evaluated)
  const mm = new Float64Array(LIMITS.length), rr = new Float64Array(LIMITS.length);
  const evaluate = (f: GridFrame, enu: Float64Array, sun: Float64Array | null, moon: Float64Array | null): number => {
    const E = enu[0], N = enu[1], U = enu[2];
    const trueAlt = Math.atan2(U, Math.sqrt(E * E + N * N)) * RAD;
    const alt = trueAlt + refractionForTrueAltitudeDeg(trueAlt, k);
    mm.fill(NaN);
    let worst = NONE;
    let worstM = -Infinity;
    let m: number;
    let wrapHold = Infinity;
    const azRate = ranges || mask ? azRateWithin(trueAlt) : 0;
    const azSpan = ranges || mask ? azRateSpanS(trueAlt) : Infinity;
    if (minAlt !== undefined) { m = mm[0] = alt - minAlt; rr[0] = ALT_RATE; if (m < 0 && m > worstM) { worst = 0; worstM = m; } }
    if (maxAlt !== undefined) { m = mm[1] = maxAlt - alt; rr[1] = ALT_RATE; if (m < 0 && m > worstM) { worst = 1; worstM = m; } }
    if (keyhole !== undefined) { m = mm[2] = 90 - alt - keyhole; rr[2] = ALT_RATE; if (m < 0 && m > worstM) { worst = 2; worstM = m; } }
    if (ranges || mask) {
      let az = Math.atan2(E, N) * RAD;
      if (az < 0) az += 360;
      if (ranges) { m = mm[3] = azimuthMarginDeg(az, ranges); rr[3] = azRate; if (m < 0 && m > worstM) { worst = 3; worstM = m; } }
      if (mask) { m = mm[4] = alt - maskAltitudeDeg(mask, az); rr[4] = ALT_RATE + slope * azRate; if (m < 0 && m > worstM) { worst = 4; worstM = m; } }
    }
    if (sun) {
      const c = E * sun[0] + N * sun[1] + U * sun[2];
      if (c > sunCos && (m = Math.acos(Math.min(1, c)) * RAD - sunLim!) < 0 && m > worstM) { worst = 5; worstM = m; }
      mm[5] = Math.acos(Math.max(-1, Math.min(1, c))) * RAD - sunLim!;
      rr[5] = SUN_RATE;
    }
    if (moon) {
      const c = E * moon[0] + N * moon[1] + U * moon[2];
      if (c > moonCos && (m = Math.acos(Math.min(1, c)) * RAD - moonLim!) < 0 && m > worstM) { worst = 6; worstM = m; }
      mm[6] = Math.acos(Math.max(-1, Math.min(1, c))) * RAD - moonLim!;
      rr[6] = MOON_RATE;
    }
    if (ha) {
      const h = (Math.atan2(-E, -f.sinLat * N + f.cosLat * U) * RAD) / 15;
      if ((m = Math.min(h - ha[0], ha[1] - h)) < 0 && m > worstM) { worst = 7; worstM = m; }
      mm[7] = m;
      const sd = f.cosLat * N + f.sinLat * U;
      const nearPole = 1 - sd * sd < COS_DEC_MIN_FOR_HA * COS_DEC_MIN_FOR_HA;
      rr[7] = nearPole ? Infinity : HA_RATE_H_S;
      // the margin jumps where the hour angle wraps from +12 h to −12 h
      wrapHold = nearPole ? 0 : (12 - h) / HA_RATE_H_S;
    }
    if (decl) {
      const d = Math.asin(Math.max(-1, Math.min(1, f.cosLat * N + f.sinLat * U))) * RAD;
      if ((m = Math.min(d - decl[0], decl[1] - d)) < 0 && m > worstM) { worst = 8; worstM = m; }
      mm[8] = m;
      rr[8] = DEC_RATE;
    }
    let t = Math.min(wrapHold, azSpan);
    if (worst === NONE) t = 0;
    else {
      const mw = mm[worst], rw = rr[worst];
      t = Math.min(t, -mw / rw);
      for (let j = 0; j < LIMITS.length; j++) {
        if (j === worst) continue;
        const mj = mm[j];
        if (Number.isNaN(mj) || mj === Infinity) continue;
        // a satisfied limit that becomes violated, or a violated one whose margin overtakes the worst
        const tj = mj >= 0 ? mj / rr[j] : (mw - mj) / (rw + rr[j]);
        if (tj < t) t = tj;
      }
    }
    hold[0] = t > 0 ? Math.min(t, SKIP_CAP_S) : 0;
    return worst;
  };
  return { evaluate, hold };
}

/** Windows inside an envelope for many targets over [from, to]. */
export function visibilityWindows(site: SiteInput, env: Envelope, targets: WindowTarget[], fromDate: Date, toDate: Date, opts: WindowOptions = {}): TargetWindows[] {
  const from = fromDate.getTime(), to = toDate.getTime();
  if (!(to > from)) return targets.map((t) => ({ name: t.name, windows: [], reasons: [] }));
  const spanMs = to - from;
  const stepMs = (opts.stepSec ?? (spanMs <= 2 * 86400000 ? 120 : 300)) * 1000;
  const nSteps = Math.ceil(spanMs / stepMs);
  const times: number[] = [];
  for (let k = 0; k <= nSteps; k++) times.push(Math.min(from + k * stepMs, to));

  const fixedIdx: number[] = [];
  const bodyIdx: number[] = [];
  targets.forEach((t, i) => ('body' in t ? bodyIdx : fixedIdx).push(i));
  const midJdTT = instantFromDate(new Date((from + to) / 2), site.dut1Sec ?? 0).jdTT;
  const fixedPlaces = fixedIdx.map((i) => {
    const t = targets[i] as { raDeg: number; decDeg: number; motion?: SpaceMotion };
    return hasMotion(t.motion) ? movedRaDec(moveStar(t.raDeg, t.decDeg, t.motion, midJdTT)) : t;
  });
  const fixedSet = { raDeg: Float64Array.from(fixedPlaces, (t) => t.raDeg), decDeg: Float64Array.from(fixedPlaces, (t) => t.decDeg) };
  const u = unitVectors(fixedSet);
  const bodiesNeeded = new Set<BodyName>(bodyIdx.map((i) => (targets[i] as { body: BodyName }).body));
  const needSun = env.sunAvoidance !== undefined;
  const needMoon = env.moonAvoidance !== undefined;
  const evaluate = makeEvaluator(env);

  const gridState = (t: number): GridState => {
    const f = skyFrame(site, new Date(t));
    const bodies = new Map<BodyName, Float64Array>();
    for (const b of bodiesNeeded) bodies.set(b, Float64Array.from(bodyVector(f, b).enu));
    const sun = needSun ? (bodies.get('sun') ?? Float64Array.from(bodyVector(f, 'sun').enu)) : null;
    const moon = needMoon ? (bodies.get('moon') ?? Float64Array.from(bodyVector(f, 'moon').enu)) : null;
    return { t, f, sun, moon, bodies };
  };

  const n = targets.length;
  const one = new Float64Array(3);
  const sunI = new Float64Array(3), moonI = new Float64Array(3);
  const prevViolation = new Int8Array(n).fill(NONE);
  const open: (number | null)[] = new Array(n).fill(null);
  const openedBy: (LimitName | 'span-start')[] = new Array(n).fill('span-start');
  const result: TargetWindows[] = targets.map((t) => ({ name: t.name, windows: [], reasons: [] }));
  const violatedCount = new Int32Array(n * LIMITS.length);

  /** State of target i at time t between grid states a (t ≥ a.t) and b. */
  const violationAt = (i: number, t: number, a: GridState, b: GridState): number => {
    const w = b.t > a.t ? (t - a.t) / (b.t - a.t) : 0;
    const dLst = (t - a.t) * EARTH_ROT_DEG_PER_MS;
    const tg = targets[i];
    if ('body' in tg) lerpUnit(a.bodies.get(tg.body)!, b.bodies.get(tg.body)!, w, one);
    else {
      const j = fixedPos[i] * 3;
      enuOf(a.f, u[j], u[j + 1], u[j + 2], dLst, one);
    }
    if (a.sun && b.sun) lerpUnit(a.sun, b.sun, w, sunI);
    if (a.moon && b.moon) lerpUnit(a.moon, b.moon, w, moonI);
    return evaluate(a.f, one, a.sun ? sunI : null, a.moon ? moonI : null);
  };
  const fixedPos: number[] = new Array(n).fill(-1);
  fixedIdx.forEach((i, j) => (fixedPos[i] = j));

  /** Bisection between grid states for the flip of target i; returns [lastBefore, firstAfter]. */
  const refineFlip = (i: number, a: GridState, b: GridState, insideBefore: boolean): { lo: number; hi: number; violation: number } => {
    let lo = a.t, hi = b.t;
    // the violated limit on the outside side of the crossing, updated as the bracket narrows
    let violation = insideBefore ? violationAt(i, hi, a, b) : prevViolation[i];
    while (hi - lo > REFINE_MS) {
      const mid = (lo + hi) / 2;
      const v = violationAt(i, mid, a, b);
      const inside = v === NONE;
      if (inside === insideBefore) lo = mid;
      else hi = mid;
      if (!inside) violation = v;
    }
    return { lo, hi, violation };
  };

  const grid = makeGridEvaluator(env);
  // what the reasons of targets that end with no window are counted from, at every grid instant (a few
  // hundred bytes each: the frame itself is not kept)
  const kept: { t: number; f: GridFrame; g: GridConsts; sun: Float64Array | null; moon: Float64Array | null }[] = [];
  /** Fixed targets: their state is known (unchanged since the last evaluation) before this instant (ms). */
  const knownUntil = new Float64Array(n).fill(-Infinity);
  const lastEval = new Int32Array(n).fill(-1);
  const two = new Float64Array(3);

  let prev: GridState | null = null;
  let prevConsts: GridConsts | null = null;
  for (let k = 0; k < times.length; k++) {
    const cur = gridState(times[k]);
    const cc = gridConsts(cur.f);
    const f = cur.f;
    kept.push({ t: cur.t, f: { icrsToEnu: f.icrsToEnu, sunToObs: f.sunToObs, vObs: f.vObs, bm1: f.bm1, sinLat: f.sinLat, cosLat: f.cosLat }, g: cc, sun: cur.sun, moon: cur.moon });
    for (let i = 0; i < n; i++) {
      const tg = targets[i];
      const isBody = 'body' in tg;
      if (!isBody && cur.t < knownUntil[i]) continue;
      let enu: Float64Array;
      if (isBody) enu = cur.bodies.get(tg.body)!;
      else {
        enuAtGrid(cur.f, cc, u, fixedPos[i] * 3, one);
        enu = one;
      }
      const v = grid.evaluate(cur.f, enu, cur.sun, cur.moon);
      if (isBody) {
        if (v !== NONE) violatedCount[i * LIMITS.length + v]++;
      } else knownUntil[i] = cur.t + grid.skip[0] * 1000;
      const evaluatedBefore = lastEval[i];
      lastEval[i] = k;
      if (k === 0) {
        if (v === NONE) { open[i] = from; openedBy[i] = 'span-start'; }
        prevViolation[i] = v;
        continue;
      }
      const wasInside = prevViolation[i] === NONE;
      const isInside = v === NONE;
      if (wasInside !== isInside && prev) {
        if (!wasInside && evaluatedBefore < k - 1) {
          // skipped at the previous grid instant: the limit violated there, exactly, for openedBy
          enuAtGrid(prev.f, prevConsts!, u, fixedPos[i] * 3, two);
          prevViolation[i] = grid.evaluate(prev.f, two, prev.sun, prev.moon);
        }
        const r = refineFlip(i, prev, cur, wasInside);
        const at = (r.lo + r.hi) / 2;
        if (isInside) {
          open[i] = at;
          const ob = r.violation !== NONE ? r.violation : prevViolation[i];
          openedBy[i] = ob !== NONE ? LIMITS[ob] : 'span-start';
        } else {
          const start = open[i] ?? from;
          result[i].windows.push({ start: new Date(Math.round(start)), end: new Date(Math.round(at)), openedBy: openedBy[i], closedBy: LIMITS[r.violation !== NONE ? r.violation : v] });
          open[i] = null;
        }
      }
      prevViolation[i] = v;
    }
    prev = cur;
    prevConsts = cc;
  }
  // reasons of fixed targets that never got inside: the violated limit at every grid instant, counted
  // (evaluated where it may have changed, carried over the grid instants where it cannot have)
  const counter = makeCountEvaluator(env);
  for (let i = 0; i < n; i++) {
    if ('body' in targets[i] || open[i] !== null || result[i].windows.length) continue;
    const j = fixedPos[i] * 3;
    for (let k = 0; k < kept.length; ) {
      const g = kept[k];
      enuAtGrid(g.f, g.g, u, j, one);
      const v = counter.evaluate(g.f, one, g.sun, g.moon);
      const until = g.t + counter.hold[0] * 1000;
      let k2 = k + 1;
      while (k2 < kept.length && kept[k2].t < until) k2++;
      if (v !== NONE) violatedCount[i * LIMITS.length + v] += k2 - k;
      k = k2;
    }
  }
  for (let i = 0; i < n; i++) {
    if (open[i] !== null) result[i].windows.push({ start: new Date(Math.round(open[i]!)), end: new Date(to), openedBy: openedBy[i], closedBy: 'span-end' });
    const r = result[i];
    r.reasons = r.windows.length
      ? r.windows.map((w) => w.closedBy)
      : LIMITS.map((l, j) => [l, violatedCount[i * LIMITS.length + j]] as const)
          .filter(([, c]) => c > 0)
          .sort((a, b) => b[1] - a[1])
          .map(([l]) => l);
  }
  return result;
}
