/**
 * Heliocentric positions of the planets and the Earth from the VSOP87B series (Bretagnon & Francou
 * 1988, A&A 202, 309), truncated by build-series.mjs to stay within 0.1″ of the full series in every
 * geocentric direction (0.04″ for the Earth) over 1900–2100. Against JPL DE405 the apparent places
 * built on them agree to a few tenths of an arcsecond (tests/unit/sky/bodies-de405.test.ts).
 *
 * VSOP87B gives spherical coordinates (L, B, R) in the ecliptic and equinox J2000 (dynamical); the
 * rotation to the equator is the one the VSOP87 files document for FK5 J2000, taken here as the
 * ICRS (the two differ by < 0.05″).
 *
 * Uranus and Neptune: VSOP87 was fitted to DE200, whose outer planets are 1–3″ off DE405 (DE405 − VSOP87B
 * reaches 1.7″ for Uranus and 3.1″ for Neptune in heliocentric longitude over 1960–2060). A smooth
 * correction (degree-6 polynomials in time of ΔL, ΔB, ΔR, fitted to DE405 by fit-outer.py, residuals
 * ≤ 0.07″) is added inside 1961–2059 and held at its end values outside. So for these two bodies the
 * DE405 check is not independent of DE405 beyond the fit itself (it checks the chain and the fit).
 */
import data from './vsop87b.json';
import outer from './outer-corrections.json';
import { nodeInterpolator } from '../ephemeris-nodes';

export type SeriesBody = 'mercury' | 'venus' | 'earth' | 'mars' | 'jupiter' | 'saturn' | 'uranus' | 'neptune';

interface Series { L: Float64Array[]; B: Float64Array[]; R: Float64Array[] }

const RAW = (data as unknown as { bodies: Record<SeriesBody, { L: number[][]; B: number[][]; R: number[][] }> }).bodies;
const SERIES = Object.fromEntries(
  Object.entries(RAW).map(([k, s]) => [k, { L: s.L.map((r) => Float64Array.from(r)), B: s.B.map((r) => Float64Array.from(r)), R: s.R.map((r) => Float64Array.from(r)) }]),
) as Record<SeriesBody, Series>;

/** Number of terms kept, by body (for the decision note and the bench). */
export const SERIES_TERMS: Record<SeriesBody, number> = Object.fromEntries(
  Object.entries(SERIES).map(([k, s]) => [k, [...s.L, ...s.B, ...s.R].reduce((a, r) => a + r.length / 3, 0)]),
) as Record<SeriesBody, number>;

const OUTER = outer as unknown as { tauRange: [number, number]; bodies: Partial<Record<SeriesBody, { L: number[]; B: number[]; R: number[] }>> };

const poly = (c: number[], t: number) => {
  let v = 0;
  for (let i = c.length - 1; i >= 0; i--) v = v * t + c[i];
  return v;
};

function sum(rows: Float64Array[], tau: number): number {
  let out = 0;
  let tp = 1;
  for (let n = 0; n < rows.length; n++) {
    const row = rows[n];
    let s = 0;
    for (let i = 0; i < row.length; i += 3) s += row[i] * Math.cos(row[i + 1] + row[i + 2] * tau);
    out += s * tp;
    tp *= tau;
  }
  return out;
}

// VSOP87 ecliptic J2000 → FK5 equator J2000 (VSOP87 documentation, file vsop87.doc).
const M = [
  1, 0.00000044036, -0.000000190919,
  -0.000000479966, 0.917482137087, -0.397776982902,
  0, 0.397776982902, 0.917482137087,
];

/** Heliocentric position (au, ICRS axes) straight from the series, at TT days since J2000.0. */
export function heliocentricIcrsExact(body: SeriesBody, dTT: number, out: number[] = [0, 0, 0]): number[] {
  const s = SERIES[body];
  const tau = dTT / 365250;
  let l = sum(s.L, tau), b = sum(s.B, tau), r = sum(s.R, tau);
  const corr = OUTER.bodies[body];
  if (corr) {
    const tc = Math.min(OUTER.tauRange[1], Math.max(OUTER.tauRange[0], tau));
    l += poly(corr.L, tc); b += poly(corr.B, tc); r += poly(corr.R, tc);
  }
  const cb = Math.cos(b);
  const x = r * cb * Math.cos(l), y = r * cb * Math.sin(l), z = r * Math.sin(b);
  out[0] = M[0] * x + M[1] * y + M[2] * z;
  out[1] = M[3] * x + M[4] * y + M[5] * z;
  out[2] = M[6] * x + M[7] * y + M[8] * z;
  return out;
}

const interpolators = new Map<SeriesBody, ReturnType<typeof nodeInterpolator>>();
/** Node spacing (days) by body, so that the cubic stays within 0.5 m of the series (ephemeris-nodes.test.ts). */
const NODE_DAYS: Partial<Record<SeriesBody, number>> = { mercury: 1 / 32, venus: 1 / 8, earth: 1 / 8 };

/**
 * Heliocentric position (au, ICRS axes) at TT days since J2000.0 (TT is used for TDB: < 2 ms): the series
 * at nodes (NODE_DAYS), cubic between them (ephemeris-nodes.ts; within 0.5 m of the series).
 */
export function heliocentricIcrs(body: SeriesBody, dTT: number, out: number[] = [0, 0, 0]): number[] {
  let f = interpolators.get(body);
  if (!f) interpolators.set(body, (f = nodeInterpolator(3, NODE_DAYS[body] ?? 0.25, (t) => heliocentricIcrsExact(body, t))));
  return f(dTT, out);
}
