/**
 * The sky frame of one site and instant, and the apparent place of catalogue positions.
 *
 * Chain for an ICRS direction (IAU SOFA atco13 order, zero proper motion and parallax):
 *   light deflection by the Sun → aberration (special-relativistic, with the observer's total
 *   barycentric velocity = Earth's orbital velocity + diurnal rotation, so diurnal aberration is
 *   included) → bias-precession-nutation N·P·B → Earth rotation (GAST) → local ENU (geodetic vertical)
 *   → refraction (refraction.ts). UT1 − UTC and polar motion come from the site (SiteInput.dut1Sec,
 *   xpArcsec, ypArcsec; default zero); check: ERFA atco13 with non-zero values (earth-orientation.test.ts).
 * Earth's barycentric state and heliocentric position come from astronomy-engine (VSOP87 based).
 * Check: reference-values.md E1–E4 (atco13) to well under 1″.
 */
import { Astronomy } from './astronomy';
import { ARCSEC, DEG, RAD, type Mat3, identity, mat3, mul, mulVec, mulVecT, rotX, rotY, wrap12, wrap24, wrap360 } from './math';
import { C_AU_PER_DAY, EARTH_ROT_RAD_PER_S, SUN_SCHWARZSCHILD_AU, WGS84_A_M, WGS84_F, AU_M } from './constants';
import { earthRotationAngleDeg, gastHours, gmstHours, instantFromDate } from './timescales';
import { enuFromOfDateForSite, npbMatrix, type SiteInput } from './frames';
import { hasMotion, moveStar, type SpaceMotion } from './motion';
import { nodeInterpolator } from './ephemeris-nodes';
import { STANDARD_CONSTANTS, apparentAltitudeDeg, type RefractionConstants, type RefractionMode } from './refraction';

export interface SkyFrame {
  site: SiteInput;
  date: Date;
  /** Julian dates (UT = UT1 here, and TT) and days since J2000.0. */
  jdUT: number;
  jdTT: number;
  dUT: number;
  dTT: number;
  deltaTSec: number;
  eraDeg: number;
  gmstHours: number;
  gastHours: number;
  /** Local apparent sidereal time, hours. */
  lstHours: number;
  /** Local mean sidereal time, hours. */
  lmstHours: number;
  /** ICRS → true equator and equinox of date (N·P·B). */
  npb: Mat3;
  /** True of date → ENU. */
  enuFromOfDate: Mat3;
  /** ICRS unit vectors → ENU [east, north, up], row-major, no aberration or refraction. */
  icrsToEnu: Mat3;
  /** Observer's barycentric velocity in units of c (ICRS), and √(1 − v²). */
  vObs: Float64Array;
  bm1: number;
  /** Observer's geocentric (diurnal) velocity in units of c (ICRS). */
  vDiurnal: Float64Array;
  /** Unit vector from the Sun to the observer (ICRS) and the distance in au. */
  sunToObs: Float64Array;
  sunDistAu: number;
  /** Observer's geocentric position in au (ICRS). */
  obsGeoAu: Float64Array;
  sinLat: number;
  cosLat: number;
  refraction: RefractionConstants;
  /** astronomy-engine's time and observer, for body positions. */
  astroTime: Astronomy.AstroTime;
  observer: Astronomy.Observer;
}

/** Geocentric position (m) of a geodetic site in the terrestrial frame (WGS84). */
export function siteItrsM(site: SiteInput, out: Float64Array | number[] = [0, 0, 0]): Float64Array | number[] {
  const phi = site.latDeg * DEG, lam = site.lonDeg * DEG;
  const e2 = WGS84_F * (2 - WGS84_F);
  const sp = Math.sin(phi), cp = Math.cos(phi);
  const n = WGS84_A_M / Math.sqrt(1 - e2 * sp * sp);
  out[0] = (n + site.heightM) * cp * Math.cos(lam);
  out[1] = (n + site.heightM) * cp * Math.sin(lam);
  out[2] = (n * (1 - e2) + site.heightM) * sp;
  return out;
}

/**
 * The Sun's velocity about the solar-system barycentre (≤ 15 m/s, i.e. ≤ 0.01″ of aberration) changes
 * over years; it is cached for a day because astronomy-engine's BaryState costs ~150 µs.
 */
let sunVelCache: { tt: number; v: [number, number, number] } | null = null;
function sunBarycentricVelocity(time: Astronomy.AstroTime): [number, number, number] {
  if (!sunVelCache || Math.abs(sunVelCache.tt - time.tt) > 1) {
    const s = Astronomy.BaryState(Astronomy.Body.Sun, time);
    sunVelCache = { tt: time.tt, v: [s.vx, s.vy, s.vz] };
  }
  return sunVelCache.v;
}

/** The Earth's heliocentric state (au, au/day; EQJ = ICRS axes) from astronomy-engine, at 3-hour nodes of its TT, cubic between (within 0.2 m). */
const earthStateBetween = nodeInterpolator(6, 1 / 8, (tt) => {
  const s = Astronomy.HelioState(Astronomy.Body.Earth, Astronomy.AstroTime.FromTerrestrialTime(tt));
  return [s.x, s.y, s.z, s.vx, s.vy, s.vz];
});
/** [x, y, z, vx, vy, vz] of the Earth at astronomy-engine's TT `tt`, into `out`. */
export const earthHelioState = (tt: number, out: Float64Array = new Float64Array(6)): Float64Array => earthStateBetween(tt, out);
const earthState = new Float64Array(6);

export interface SkyFrameOptions {
  refraction?: RefractionConstants;
  /** Observer at the geocentre (no diurnal aberration or parallax): geocentric apparent places. */
  geocentric?: boolean;
}

/** Everything one site and instant needs, computed once (≈ 50 µs). */
export function skyFrame(site: SiteInput, date: Date, opts: SkyFrameOptions = {}): SkyFrame {
  const t = instantFromDate(date, site.dut1Sec ?? 0);
  const era = earthRotationAngleDeg(t.dUT);
  const gmst = gmstHours(t.dUT, t.dTT);
  const gast = gastHours(t.dUT, t.dTT);
  const lst = wrap24(gast + site.lonDeg / 15);
  const npb = npbMatrix(mat3(), t.dTT);
  const enuFromOfDate = enuFromOfDateForSite(mat3(), site, gast * 15);
  const icrsToEnu = mul(mat3(), enuFromOfDate, npb);

  // Observer geocentric position and velocity: terrestrial → (polar motion, Wᵀ) → true of date (R3(−GAST))
  // → ICRS (NPBᵀ).
  const r = opts.geocentric ? [0, 0, 0] : siteItrsM(site);
  if (site.xpArcsec || site.ypArcsec) {
    const xp = (site.xpArcsec ?? 0) * ARCSEC, yp = (site.ypArcsec ?? 0) * ARCSEC;
    const w = rotX(mat3(), -yp, rotY(mat3(), -xp, identity(mat3())));
    mulVecT(r, w, [r[0], r[1], r[2]]);
  }
  const th = gast * 15 * DEG;
  const c = Math.cos(th), s = Math.sin(th);
  const pos = [r[0] * c - r[1] * s, r[0] * s + r[1] * c, r[2]];
  const w = EARTH_ROT_RAD_PER_S;
  const vel = [-w * pos[1], w * pos[0], 0]; // m/s, of date
  const obsGeoAu = new Float64Array(3);
  mulVecT(obsGeoAu, npb, pos);
  for (let i = 0; i < 3; i++) obsGeoAu[i] /= AU_M;
  const vDiurnal = new Float64Array(3);
  mulVecT(vDiurnal, npb, vel);
  const cMs = (C_AU_PER_DAY * AU_M) / 86400;
  for (let i = 0; i < 3; i++) vDiurnal[i] /= cMs;

  const astroTime = Astronomy.MakeTime(date);
  const helio = earthHelioState(astroTime.tt, earthState);
  const sunV = sunBarycentricVelocity(astroTime);
  const vObs = Float64Array.of(
    (helio[3] + sunV[0]) / C_AU_PER_DAY + vDiurnal[0],
    (helio[4] + sunV[1]) / C_AU_PER_DAY + vDiurnal[1],
    (helio[5] + sunV[2]) / C_AU_PER_DAY + vDiurnal[2],
  );
  const v2 = vObs[0] * vObs[0] + vObs[1] * vObs[1] + vObs[2] * vObs[2];
  const eh = [helio[0] + obsGeoAu[0], helio[1] + obsGeoAu[1], helio[2] + obsGeoAu[2]];
  const em = Math.hypot(eh[0], eh[1], eh[2]);

  return {
    site, date,
    jdUT: t.jdUT, jdTT: t.jdTT, dUT: t.dUT, dTT: t.dTT, deltaTSec: t.deltaTSec,
    eraDeg: era, gmstHours: gmst, gastHours: gast, lstHours: lst, lmstHours: wrap24(gmst + site.lonDeg / 15),
    npb, enuFromOfDate, icrsToEnu,
    vObs, bm1: Math.sqrt(1 - v2), vDiurnal,
    sunToObs: Float64Array.of(eh[0] / em, eh[1] / em, eh[2] / em), sunDistAu: em,
    obsGeoAu,
    sinLat: Math.sin(site.latDeg * DEG), cosLat: Math.cos(site.latDeg * DEG),
    refraction: opts.refraction ?? STANDARD_CONSTANTS,
    astroTime,
    observer: new Astronomy.Observer(site.latDeg, site.lonDeg, site.heightM),
  };
}

/**
 * In place: light deflection by the Sun then aberration, for an ICRS unit vector p (natural
 * direction) → apparent (proper) direction, still in ICRS axes.
 */
export function deflectAndAberrate(f: SkyFrame, p: Float64Array | number[]): void {
  const e = f.sunToObs;
  const pe = p[0] * e[0] + p[1] * e[1] + p[2] * e[2];
  const dlim = 1e-6 / Math.max(f.sunDistAu * f.sunDistAu, 1);
  const wl = SUN_SCHWARZSCHILD_AU / f.sunDistAu / Math.max(1 + pe, dlim);
  p[0] += wl * (e[0] - p[0] * pe);
  p[1] += wl * (e[1] - p[1] * pe);
  p[2] += wl * (e[2] - p[2] * pe);
  aberrate(f, p);
}

/**
 * In place: aberration (IAU SOFA ab: special-relativistic, observer's total barycentric velocity incl.
 * the diurnal part) of a natural direction p (ICRS axes) → proper direction.
 */
export function aberrate(f: SkyFrame, p: Float64Array | number[]): void {
  let x = p[0], y = p[1], z = p[2];
  const v = f.vObs;
  const bm1 = f.bm1;
  const pdv = x * v[0] + y * v[1] + z * v[2];
  const w1 = 1 + pdv / (1 + bm1);
  const w2 = SUN_SCHWARZSCHILD_AU / f.sunDistAu;
  x = x * bm1 + w1 * v[0] + w2 * (v[0] - pdv * x);
  y = y * bm1 + w1 * v[1] + w2 * (v[1] - pdv * y);
  z = z * bm1 + w1 * v[2] + w2 * (v[2] - pdv * z);
  const n = Math.hypot(x, y, z);
  p[0] = x / n; p[1] = y / n; p[2] = z / n;
}

/** Topocentric apparent place of an ICRS position: of-date vector and ENU vector (unrefracted). */
export interface ApparentPlace {
  /** Apparent direction, true equator and equinox of date (topocentric, incl. diurnal aberration). */
  ofDate: [number, number, number];
  /** Same direction in ENU. */
  enu: [number, number, number];
}

/**
 * Apparent place of an ICRS catalogue position; with `motion` the star is first moved to the date by its
 * space motion (motion.ts) and, when it has a parallax, seen from the observer's heliocentric position
 * (the Sun–barycentre offset, ≤ 0.01 au, changes a parallax of 0.77″ by < 0.01″).
 */
export function apparentFromIcrs(f: SkyFrame, raDeg: number, decDeg: number, motion?: SpaceMotion): ApparentPlace {
  let p: number[];
  if (hasMotion(motion)) {
    const s = moveStar(raDeg, decDeg, motion, f.jdTT);
    p = s.u;
    if (Number.isFinite(s.distanceAu)) {
      const d = s.distanceAu, e = f.sunToObs, r = f.sunDistAu;
      const x = p[0] * d - e[0] * r, y = p[1] * d - e[1] * r, z = p[2] * d - e[2] * r;
      const n = Math.hypot(x, y, z);
      p = [x / n, y / n, z / n];
    }
  } else {
    const cd = Math.cos(decDeg * DEG);
    p = [cd * Math.cos(raDeg * DEG), cd * Math.sin(raDeg * DEG), Math.sin(decDeg * DEG)];
  }
  deflectAndAberrate(f, p);
  const ofDate = mulVec([0, 0, 0], f.npb, p) as [number, number, number];
  const enu = mulVec([0, 0, 0], f.enuFromOfDate, ofDate) as [number, number, number];
  return { ofDate, enu };
}

/** Horizontal and equatorial-of-date description of an apparent direction given as ENU. */
export interface HorizontalPlace {
  azDeg: number;
  /** Apparent altitude (after refraction for mode 'standard'). */
  altDeg: number;
  /** Geometric (unrefracted) altitude. */
  trueAltDeg: number;
  haHours: number;
  raOfDateDeg: number;
  decOfDateDeg: number;
}

export function describeEnu(f: SkyFrame, enu: ArrayLike<number>, mode: RefractionMode): HorizontalPlace {
  const [E, N, U] = [enu[0], enu[1], enu[2]];
  const h = Math.hypot(E, N);
  const trueAlt = Math.atan2(U, h) * RAD;
  const az = h === 0 ? 0 : wrap360(Math.atan2(E, N) * RAD);
  // Local equatorial: HA measured westward from the meridian; dec from the pole axis (0, cos φ, sin φ).
  const haDeg = Math.atan2(-E, -f.sinLat * N + f.cosLat * U) * RAD;
  const decDeg = Math.asin(Math.max(-1, Math.min(1, f.cosLat * N + f.sinLat * U))) * RAD;
  const haHours = wrap12(haDeg / 15);
  return {
    azDeg: az,
    altDeg: apparentAltitudeDeg(trueAlt, mode, f.refraction),
    trueAltDeg: trueAlt,
    haHours,
    raOfDateDeg: wrap360((f.lstHours - haHours) * 15),
    decOfDateDeg: decDeg,
  };
}

/** Apparent topocentric place of an ICRS position at a frame: az/alt, HA, RA/Dec of date. */
export function observeIcrs(f: SkyFrame, raDeg: number, decDeg: number, mode: RefractionMode = 'standard', motion?: SpaceMotion): HorizontalPlace {
  const { enu } = apparentFromIcrs(f, raDeg, decDeg, motion);
  return describeEnu(f, enu, mode);
}

/** Adds first-order diurnal aberration to a unit ICRS vector (bodies from astronomy-engine lack it). */
export function addDiurnalAberration(f: SkyFrame, p: Float64Array | number[]): void {
  const v = f.vDiurnal;
  const pv = p[0] * v[0] + p[1] * v[1] + p[2] * v[2];
  const x = p[0] + v[0] - p[0] * pv, y = p[1] + v[1] - p[1] * pv, z = p[2] + v[2] - p[2] * pv;
  const n = Math.hypot(x, y, z);
  p[0] = x / n; p[1] = y / n; p[2] = z / n;
}

export const ARCSEC_DEG = ARCSEC / DEG;
