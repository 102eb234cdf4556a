/**
 * Time scales for the sky engine.
 *
 * - Instants come in as JavaScript `Date`s (UTC). UT1 − UTC (|DUT1| < 0.9 s) is 0 unless the site
 *   carries it (SiteInput.dut1Sec, from IERS Bulletin A): without it Earth rotation is uncertain by up
 *   to 13.5″, fine for planning, not for pointing.
 * - TT = UTC + (TAI − UTC) + 32.184 s inside the leap-second era (IERS Bulletin C table below), so
 *   ΔT = TT − UT1 is then exact up to DUT1. Before 1972 ΔT is the Espenak–Meeus polynomial fit; after
 *   the last leap second ΔT is held at 69.184 s to 2030 and then blended linearly into the
 *   Espenak–Meeus extrapolation by 2060 (the future is unknown at the minute level anyway).
 * - Earth rotation angle: IERS Conventions (2010) eq. 5.15. GMST: IAU 2006 (Capitaine et al. 2003),
 *   GAST = GMST + equation of the equinoxes (Δψ cos εA + the two largest complementary terms).
 *
 * Internally instants are "days since J2000.0" (JD 2451545.0), which keeps double precision at the
 * microsecond level; Julian dates are derived for display and the API.
 */
import { DeltaT_EspenakMeeus } from 'astronomy-engine';
import { DEG, wrap24, wrap360 } from './math';
import { nutationIau2000b, meanObliquityRad } from './nutation';
import { DAYS_PER_CENTURY } from './constants';

export const J2000_JD = 2451545.0;
export const MJD_OFFSET = 2400000.5;

const MS_PER_DAY = 86_400_000;
const J2000_MS = Date.UTC(2000, 0, 1, 12, 0, 0);

/** TAI − UTC in seconds from each date (UTC, 0h) — IERS Bulletin C; the last change was 2017-01-01. */
const LEAP_SECONDS: ReadonlyArray<readonly [number, number]> = [
  [Date.UTC(1972, 0, 1), 10], [Date.UTC(1972, 6, 1), 11], [Date.UTC(1973, 0, 1), 12], [Date.UTC(1974, 0, 1), 13],
  [Date.UTC(1975, 0, 1), 14], [Date.UTC(1976, 0, 1), 15], [Date.UTC(1977, 0, 1), 16], [Date.UTC(1978, 0, 1), 17],
  [Date.UTC(1979, 0, 1), 18], [Date.UTC(1980, 0, 1), 19], [Date.UTC(1981, 6, 1), 20], [Date.UTC(1982, 6, 1), 21],
  [Date.UTC(1983, 6, 1), 22], [Date.UTC(1985, 6, 1), 23], [Date.UTC(1988, 0, 1), 24], [Date.UTC(1990, 0, 1), 25],
  [Date.UTC(1991, 0, 1), 26], [Date.UTC(1992, 6, 1), 27], [Date.UTC(1993, 6, 1), 28], [Date.UTC(1994, 6, 1), 29],
  [Date.UTC(1996, 0, 1), 30], [Date.UTC(1997, 6, 1), 31], [Date.UTC(1999, 0, 1), 32], [Date.UTC(2006, 0, 1), 33],
  [Date.UTC(2009, 0, 1), 34], [Date.UTC(2012, 6, 1), 35], [Date.UTC(2015, 6, 1), 36], [Date.UTC(2017, 0, 1), 37],
];
const TT_MINUS_TAI = 32.184;
const HOLD_UNTIL_YEAR = 2030;
const BLEND_UNTIL_YEAR = 2060;

/**
 * Espenak & Meeus (2006) polynomial expressions for ΔT (NASA eclipse web site), in seconds, as
 * implemented by astronomy-engine (which counts years from 2000-01-15).
 */
export function deltaTEspenakMeeus(year: number): number {
  return DeltaT_EspenakMeeus((year - 2000) * 365.24217 + 14);
}

/** TAI − UTC at a UTC instant (ms since 1970), or null before 1972. */
export function taiMinusUtc(ms: number): number | null {
  if (ms < LEAP_SECONDS[0][0]) return null;
  let v = LEAP_SECONDS[0][1];
  for (const [from, s] of LEAP_SECONDS) {
    if (ms >= from) v = s;
    else break;
  }
  return v;
}

const decimalYear = (ms: number) => 2000 + (ms - Date.UTC(2000, 0, 1)) / (365.2425 * MS_PER_DAY);

/** ΔT = TT − UT1 in seconds at a UT Julian date (model described at the top of this file). */
export function deltaTSeconds(jdUT: number): number {
  const ms = (jdUT - J2000_JD) * MS_PER_DAY + J2000_MS;
  const year = decimalYear(ms);
  const tai = taiMinusUtc(ms);
  if (tai === null) return deltaTEspenakMeeus(year);
  const held = tai + TT_MINUS_TAI;
  if (year <= HOLD_UNTIL_YEAR) return held;
  if (year >= BLEND_UNTIL_YEAR) return deltaTEspenakMeeus(year);
  const w = (year - HOLD_UNTIL_YEAR) / (BLEND_UNTIL_YEAR - HOLD_UNTIL_YEAR);
  return held * (1 - w) + deltaTEspenakMeeus(BLEND_UNTIL_YEAR) * w;
}

/** Days since J2000.0 (UT) of a Date. */
export const utDaysFromDate = (date: Date): number => (date.getTime() - J2000_MS) / MS_PER_DAY;
export const dateFromUtDays = (d: number): Date => new Date(J2000_MS + d * MS_PER_DAY);
export const jdFromDate = (date: Date): number => utDaysFromDate(date) + J2000_JD;
export const dateFromJd = (jd: number): Date => dateFromUtDays(jd - J2000_JD);
/** TT days since J2000.0 for a UT day count. */
export const ttDaysFromUtDays = (dUT: number): number => dUT + deltaTSeconds(dUT + J2000_JD) / 86400;

/** Earth rotation angle in degrees [0, 360) for UT1 days since J2000.0 (IERS Conventions 2010, eq. 5.15). */
export function earthRotationAngleDeg(dUT1: number): number {
  const f = dUT1 - Math.floor(dUT1);
  const turns = f + 0.779057273264 + 0.00273781191135448 * dUT1;
  return wrap360(360 * (turns - Math.floor(turns)));
}

/** Greenwich mean sidereal time, IAU 2006, in hours [0, 24). */
export function gmstHours(dUT1: number, dTT: number): number {
  const t = dTT / DAYS_PER_CENTURY;
  const polyArcsec = 0.014506 + t * (4612.156534 + t * (1.3915817 + t * (-0.00000044 + t * (-0.000029956 + t * -0.0000000368))));
  return wrap24((earthRotationAngleDeg(dUT1) + polyArcsec / 3600) / 15);
}

/**
 * Equation of the equinoxes in degrees: Δψ cos εA plus the two largest complementary terms
 * (IERS Conventions 2003, 2640.96 µas sin Ω + 63.52 µas sin 2Ω).
 */
export function equationOfEquinoxesDeg(dTT: number): number {
  const t = dTT / DAYS_PER_CENTURY;
  const { dPsiRad } = nutationIau2000b(dTT);
  const epsA = meanObliquityRad(dTT);
  const omRad = (((450160.398036 - 6962890.5431 * t) % 1296000) / 3600) * DEG;
  const ctArcsec = 0.00264096 * Math.sin(omRad) + 0.00006352 * Math.sin(2 * omRad);
  return (dPsiRad * Math.cos(epsA)) / DEG + ctArcsec / 3600;
}

/** Greenwich apparent sidereal time in hours [0, 24). */
export function gastHours(dUT1: number, dTT: number): number {
  return wrap24(gmstHours(dUT1, dTT) + equationOfEquinoxesDeg(dTT) / 15);
}

/** Local mean / apparent sidereal time in hours for an east-positive longitude. */
export const lmstHours = (dUT1: number, dTT: number, lonDeg: number) => wrap24(gmstHours(dUT1, dTT) + lonDeg / 15);
export const lastHours = (dUT1: number, dTT: number, lonDeg: number) => wrap24(gastHours(dUT1, dTT) + lonDeg / 15);

/** All the time quantities of one instant. */
export interface Instant {
  date: Date;
  /** UT (= UT1 here) and TT days since J2000.0. */
  dUT: number;
  dTT: number;
  jdUT: number;
  jdTT: number;
  deltaTSec: number;
}

/**
 * The time quantities of a UTC instant. With `dut1Sec` (UT1 − UTC) Earth rotation uses UT1 = UTC + DUT1,
 * while TT stays UTC + (TAI − UTC) + 32.184 s; ΔT = TT − UT1 is then the model's value − DUT1.
 */
export function instantFromDate(date: Date, dut1Sec = 0): Instant {
  const dUTC = utDaysFromDate(date);
  const ttMinusUtc = deltaTSeconds(dUTC + J2000_JD);
  const dUT = dUTC + dut1Sec / 86400;
  const dTT = dUTC + ttMinusUtc / 86400;
  return { date, dUT, dTT, jdUT: dUT + J2000_JD, jdTT: dTT + J2000_JD, deltaTSec: ttMinusUtc - dut1Sec };
}
