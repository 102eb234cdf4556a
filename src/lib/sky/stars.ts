/**
 * Batched apparent places: every catalogue star (or any typed array of ICRS positions) to apparent
 * alt/az or ENU for one instant, in one allocation-free pass.
 *
 * Per star: unit vector (precomputed once per position set) → light deflection by the Sun and
 * relativistic aberration (observer's barycentric + diurnal velocity) as a few vector multiply-adds
 * → one 3×3 rotation ICRS → ENU (N·P·B, Earth rotation, site) → optional refraction.
 * Same mathematics as the per-star chain in apparent.ts, so they agree to ~1e-10 rad; the test
 * checks 1″ over the whole catalogue.
 */
import { RAD, DEG } from './math';
import { SUN_SCHWARZSCHILD_AU } from './constants';
import type { SkyFrame } from './apparent';
import { refractionForTrueAltitudeDeg, type RefractionMode } from './refraction';

/** Anything with parallel RA/Dec arrays in degrees (the catalogue, or a target list). */
export interface PositionSet {
  raDeg: ArrayLike<number>;
  decDeg: ArrayLike<number>;
}

const unitCache = new WeakMap<object, Float64Array>();

/** ICRS unit vectors of a position set (cached per set object; call `invalidateUnitVectors` after mutating it). */
export function unitVectors(set: PositionSet): Float64Array {
  let u = unitCache.get(set);
  const n = set.raDeg.length;
  if (u && u.length === 3 * n) return u;
  u = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const a = set.raDeg[i] * DEG, d = set.decDeg[i] * DEG;
    const cd = Math.cos(d);
    u[3 * i] = cd * Math.cos(a);
    u[3 * i + 1] = cd * Math.sin(a);
    u[3 * i + 2] = Math.sin(d);
  }
  unitCache.set(set, u);
  return u;
}

export function invalidateUnitVectors(set: PositionSet): void {
  unitCache.delete(set);
}

export interface BatchOptions {
  /** 'standard' (default) adds refraction to the altitude; 'none' leaves geometric altitudes. */
  refraction?: RefractionMode;
}

/**
 * Core pass: apparent ENU (unrefracted) of each unit vector into out[3i..3i+2] (Float64 or Float32).
 * Allocation-free.
 */
export function unitVectorsToEnu(f: SkyFrame, u: Float64Array, out: Float64Array | Float32Array, count = u.length / 3): void {
  const m = f.icrsToEnu;
  const m0 = m[0], m1 = m[1], m2 = m[2], m3 = m[3], m4 = m[4], m5 = m[5], m6 = m[6], m7 = m[7], m8 = m[8];
  const ex = f.sunToObs[0], ey = f.sunToObs[1], ez = f.sunToObs[2];
  const vx = f.vObs[0], vy = f.vObs[1], vz = f.vObs[2];
  const bm1 = f.bm1;
  const inv1bm1 = 1 / (1 + bm1);
  const w0 = SUN_SCHWARZSCHILD_AU / f.sunDistAu;
  const dlim = 1e-6 / Math.max(f.sunDistAu * f.sunDistAu, 1);
  for (let i = 0, k = 0; i < count; i++, k += 3) {
    let x = u[k], y = u[k + 1], z = u[k + 2];
    // Light deflection by the Sun (star: source direction = natural direction).
    const pe = x * ex + y * ey + z * ez;
    const q = 1 + pe;
    const wl = w0 / (q > dlim ? q : dlim);
    x += wl * (ex - x * pe);
    y += wl * (ey - y * pe);
    z += wl * (ez - z * pe);
    // Aberration (relativistic form, as IAU SOFA ab()).
    const pdv = x * vx + y * vy + z * vz;
    const w1 = 1 + pdv * inv1bm1;
    const X = x * bm1 + w1 * vx + w0 * (vx - pdv * x);
    const Y = y * bm1 + w1 * vy + w0 * (vy - pdv * y);
    const Z = z * bm1 + w1 * vz + w0 * (vz - pdv * z);
    const r = 1 / Math.sqrt(X * X + Y * Y + Z * Z);
    out[k] = (m0 * X + m1 * Y + m2 * Z) * r;
    out[k + 1] = (m3 * X + m4 * Y + m5 * Z) * r;
    out[k + 2] = (m6 * X + m7 * Y + m8 * Z) * r;
  }
}

const scratch = { buf: new Float64Array(0) };
function scratchFor(n: number): Float64Array {
  if (scratch.buf.length < 3 * n) scratch.buf = new Float64Array(3 * n);
  return scratch.buf;
}

/**
 * All positions of a set to apparent altitude/azimuth (degrees) for one frame. Allocation-free after
 * the first call for a set (unit vectors and one scratch buffer are cached).
 */
export function starsToHorizontal(set: PositionSet, f: SkyFrame, outAltDeg: Float64Array, outAzDeg: Float64Array, opts: BatchOptions = {}): void {
  const n = set.raDeg.length;
  const u = unitVectors(set);
  const enu = scratchFor(n);
  unitVectorsToEnu(f, u, enu, n);
  const refract = (opts.refraction ?? 'standard') === 'standard';
  const k = f.refraction;
  for (let i = 0, j = 0; i < n; i++, j += 3) {
    const E = enu[j], N = enu[j + 1], U = enu[j + 2];
    let alt = Math.atan2(U, Math.sqrt(E * E + N * N)) * RAD;
    if (refract) alt += refractionForTrueAltitudeDeg(alt, k);
    outAltDeg[i] = alt;
    const az = Math.atan2(E, N) * RAD;
    outAzDeg[i] = az < 0 ? az + 360 : az;
  }
}

/**
 * All positions of a set to apparent ENU unit vectors [e, n, u] packed in outXYZ (length 3n), for
 * drawing. With refraction (default 'standard') the vector is lifted to the apparent altitude.
 */
export function starsToEnu(set: PositionSet, f: SkyFrame, outXYZ: Float32Array | Float64Array, opts: BatchOptions = {}): void {
  const n = set.raDeg.length;
  const u = unitVectors(set);
  unitVectorsToEnu(f, u, outXYZ, n);
  if ((opts.refraction ?? 'standard') !== 'standard') return;
  const k = f.refraction;
  for (let i = 0, j = 0; i < n; i++, j += 3) {
    const E = outXYZ[j], N = outXYZ[j + 1], U = outXYZ[j + 2];
    const h = Math.sqrt(E * E + N * N);
    const alt = Math.atan2(U, h);
    const app = alt + refractionForTrueAltitudeDeg(alt * RAD, k) * DEG;
    const s = h > 0 ? Math.cos(app) / h : 0;
    outXYZ[j] = E * s;
    outXYZ[j + 1] = N * s;
    outXYZ[j + 2] = Math.sin(app);
  }
}
