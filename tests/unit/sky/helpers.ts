/** Shared helpers for the sky tests: sexagesimal input, angle differences, a TT → Date converter. */
import { deltaTSeconds, dateFromUtDays, J2000_JD } from '../../../src/lib/sky/timescales';

export const hms = (h: number, m: number, s: number) => (h + m / 60 + s / 3600) * 15;
export const dms = (sign: 1 | -1, d: number, m: number, s: number) => sign * (d + m / 60 + s / 3600);
/** Signed difference a − b of two angles in degrees, in (−180, 180]. */
export const dAngle = (a: number, b: number) => {
  const r = (((a - b) % 360) + 540) % 360 - 180;
  return r === -180 ? 180 : r;
};
export const arcsec = (deg: number) => deg * 3600;
/** The UTC Date whose TT Julian date is jdTT (ΔT of the engine). */
export function dateFromJdTT(jdTT: number): Date {
  const dTT = jdTT - J2000_JD;
  let dUT = dTT;
  for (let i = 0; i < 5; i++) dUT = dTT - deltaTSeconds(dUT + J2000_JD) / 86400;
  return dateFromUtDays(dUT);
}
/** Seconds of time of an hour value's fractional part. */
export const hoursToHms = (h: number) => {
  const hh = Math.floor(h);
  const m = Math.floor((h - hh) * 60);
  return { h: hh, m, s: ((h - hh) * 60 - m) * 60 };
};
/** Deterministic pseudo-random numbers (mulberry32) so failures are reproducible. */
export function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
