// The visibility-windows search as it was before the skip-ahead rewrite (commit 816a511), kept
// unchanged as the reference that tests/unit/sky/windows-equal.test.ts compares the product with. Not product code.
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
 */
import { hasMotion, moveStar, movedRaDec, type SpaceMotion } from '../../../../src/lib/sky/motion';
import { instantFromDate } from '../../../../src/lib/sky/timescales';
import { RAD } from '../../../../src/lib/sky/math';
import { SUN_SCHWARZSCHILD_AU } from '../../../../src/lib/sky/constants';
import { skyFrame, type SkyFrame } from '../../../../src/lib/sky/apparent';
import { bodyVector, type BodyName } from '../../../../src/lib/sky/bodies';
import { unitVectors, unitVectorsToEnu } from '../../../../src/lib/sky/stars';
import { STANDARD_CONSTANTS, refractionForTrueAltitudeDeg } from '../../../../src/lib/sky/refraction';
import { azimuthMarginDeg, maskAltitudeDeg, prepareMask, type Envelope, type LimitName } from '../../../../src/lib/sky/envelope';
import type { SiteInput } from '../../../../src/lib/sky/frames';

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

/** Windows inside an envelope for many targets over [from, to]. */
export function visibilityWindowsBefore(site: SiteInput, env: Envelope, targets: WindowTarget[], fromDate: Date, toDate: Date, opts: WindowOptions = {}): TargetWindows[] {
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
  const nFixed = fixedIdx.length;
  const enuBuf = new Float64Array(3 * nFixed);
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

  let prev: GridState | null = null;
  for (let k = 0; k < times.length; k++) {
    const cur = gridState(times[k]);
    if (nFixed) unitVectorsToEnu(cur.f, u, enuBuf, nFixed);
    for (let i = 0; i < n; i++) {
      const tg = targets[i];
      let enu: Float64Array;
      if ('body' in tg) enu = cur.bodies.get(tg.body)!;
      else {
        const j = fixedPos[i] * 3;
        one[0] = enuBuf[j]; one[1] = enuBuf[j + 1]; one[2] = enuBuf[j + 2];
        enu = one;
      }
      const v = evaluate(cur.f, enu, cur.sun, cur.moon);
      if (v !== NONE) violatedCount[i * LIMITS.length + v]++;
      if (k === 0) {
        if (v === NONE) { open[i] = from; openedBy[i] = 'span-start'; }
        prevViolation[i] = v;
        continue;
      }
      const wasInside = prevViolation[i] === NONE;
      const isInside = v === NONE;
      if (wasInside !== isInside && prev) {
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
